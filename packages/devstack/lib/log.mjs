/** A failure the person running the script can act on; `details` holds captured output worth showing. */
export class DevstackError extends Error {
  constructor(message, { details = '' } = {}) {
    super(message);
    this.details = details;
  }
}

export class Interrupted extends Error {
  constructor(signal) {
    super(`interrupted by ${signal}`);
    this.signal = signal;
  }
}

const timings = [];

export function formatSeconds(ms) {
  return `${(ms / 1000).toFixed(1)} s`;
}

export function info(message) {
  console.log(message);
}

export function warn(message) {
  console.error(`! ${message}`);
}

/** Runs one named phase, prints how long it took, and on failure says which phase failed and why. */
export async function step(title, fn) {
  const started = Date.now();
  console.log(`\n• ${title}`);
  try {
    const result = await fn();
    const took = Date.now() - started;
    timings.push({ title, ms: took, ok: true });
    console.log(`✓ ${title} (${formatSeconds(took)})`);
    return result;
  } catch (error) {
    const took = Date.now() - started;
    timings.push({ title, ms: took, ok: false });
    if (error instanceof Interrupted) throw error;
    if (error instanceof DevstackError && error.details) console.error(error.details.trimEnd());
    const failure = new DevstackError(`${title} failed: ${error instanceof Error ? error.message : String(error)}`);
    failure.reported = true;
    console.error(`✗ ${failure.message} (${formatSeconds(took)})`);
    throw failure;
  }
}

/** For phases whose outcome is reported elsewhere (a test run that fails is not a script failure). */
export function recordTiming(title, ms, ok) {
  timings.push({ title, ms, ok });
}

export function printTimings() {
  if (timings.length === 0) return;
  const width = Math.max(...timings.map((t) => t.title.length));
  console.log('\nPhase times:');
  for (const t of timings) console.log(`  ${t.ok ? '✓' : '✗'} ${t.title.padEnd(width)} ${formatSeconds(t.ms).padStart(8)}`);
}
