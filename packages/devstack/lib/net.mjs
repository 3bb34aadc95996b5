import { createServer } from 'node:net';
import { DevstackError, Interrupted } from './log.mjs';
import { describeExit, interruptible, sleep } from './proc.mjs';

export function freePort(host = '127.0.0.1') {
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.once('error', reject);
    server.listen(0, host, () => {
      const { port } = server.address();
      server.close(() => resolve(port));
    });
  });
}

function portIsFree(port, host) {
  return new Promise((resolve) => {
    const server = createServer();
    server.once('error', () => resolve(false));
    server.listen(port, host, () => server.close(() => resolve(true)));
  });
}

/** Fails with one message naming every port that is taken and the variable that moves it. */
export async function requireFreePorts(wanted, host = '127.0.0.1') {
  const taken = [];
  for (const w of wanted) if (!(await portIsFree(w.port, host))) taken.push(w);
  if (taken.length === 0) return;
  throw new DevstackError(
    taken.map((w) => `port ${w.port} (${w.purpose}) is already in use by another program; free it or set ${w.variable}`).join('\n'),
  );
}

export function envPort(variable, fallback) {
  const raw = process.env[variable];
  if (raw === undefined || raw === '') return fallback;
  const port = Number(raw);
  if (!/^\d+$/.test(raw) || port < 1 || port > 65535) throw new DevstackError(`${variable} must be a port number from 1 to 65535, got "${raw}"`);
  return port;
}

/** Polls until `url` answers 200; fails early when the service behind it exits. */
export async function waitForHttp(url, { service, timeoutMs = 60_000 } = {}) {
  const deadline = Date.now() + timeoutMs;
  let last = 'no answer yet';
  while (Date.now() < deadline) {
    if (service?.exitInfo) throw new DevstackError(`${service.name} ${describeExit(service.exitInfo)} before ${url} answered`);
    try {
      const res = await interruptible(fetch(url, { signal: AbortSignal.timeout(2000) }));
      if (res.status === 200) return;
      last = `status ${res.status}`;
    } catch (error) {
      if (error instanceof Interrupted) throw error;
      last = error?.cause?.code ?? error?.message ?? String(error);
    }
    await interruptible(sleep(250));
  }
  throw new DevstackError(`${url} did not answer 200 within ${timeoutMs / 1000} s (last: ${last})`);
}
