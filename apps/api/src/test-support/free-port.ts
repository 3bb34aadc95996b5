import net from 'node:net';

function tryListen(port: number): Promise<number | null> {
  return new Promise((resolve) => {
    const server = net.createServer();
    server.once('error', () => resolve(null));
    server.listen(port, '127.0.0.1', () => {
      const chosen = (server.address() as net.AddressInfo).port;
      server.close(() => resolve(chosen));
    });
  });
}

/**
 * A loopback port nobody listens on. HB_TEST_PORT_RANGE ("41400-41499") keeps the choice inside a range,
 * for machines where several people run tests side by side; otherwise the system picks one.
 */
export async function freePort(): Promise<number> {
  const range = process.env.HB_TEST_PORT_RANGE?.match(/^(\d+)-(\d+)$/);
  if (!range) return (await tryListen(0))!;
  const [low, high] = [Number(range[1]), Number(range[2])];
  const start = low + Math.floor(Math.random() * (high - low + 1));
  for (let i = 0; i <= high - low; i++) {
    const port = low + ((start - low + i) % (high - low + 1));
    if ((await tryListen(port)) !== null) return port;
  }
  throw new Error(`No free port in HB_TEST_PORT_RANGE ${process.env.HB_TEST_PORT_RANGE}`);
}
