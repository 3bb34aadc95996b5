/**
 * Retries `probe` until it answers something other than undefined, or throws after `timeoutMs`: the
 * process tests wait for conditions, never for a fixed time, so they hold up on a loaded machine.
 */
export async function waitFor<T>(what: string, probe: () => Promise<T | undefined>, timeoutMs = 30_000, intervalMs = 100): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  let last: unknown;
  for (;;) {
    try {
      const value = await probe();
      if (value !== undefined) return value;
    } catch (err) {
      last = err;
    }
    if (Date.now() > deadline) throw new Error(`Gave up waiting for ${what} after ${timeoutMs} ms${last instanceof Error ? `: ${last.message}` : ''}`);
    await new Promise((r) => setTimeout(r, intervalMs));
  }
}
