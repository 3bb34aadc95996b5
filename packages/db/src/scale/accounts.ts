/**
 * Sign-in accounts of the two scale outfits, shared by the generator and the benchmark. The password is
 * only ever used against a local scale database.
 */
export const SCALE_PASSWORD = 'scale-outfit-password';

export const SCALE_OPERATIONS = [
  { key: 'a', name: 'Brannock Hollow Custom Work', seed: 20_161 },
  { key: 'b', name: 'Wesselbrook Machinery Ring', seed: 31_337 },
] as const;

export type ScaleOperationKey = (typeof SCALE_OPERATIONS)[number]['key'];

export const scaleEmail = (key: ScaleOperationKey, who: string) => `${who}@${key}.scale.hitchbook.test`;

/** The year every scale dataset ends with, whatever the day it is generated: the data never changes with the clock. */
export const SCALE_LAST_YEAR = 2025;

/** Approved entries of one customer kept unbilled for the issuing benchmark: batches of a week each, in the year after the history. */
export const BENCH_BATCHES = 24;
export const BENCH_BATCH_ENTRIES = 500;
export const BENCH_YEAR = SCALE_LAST_YEAR + 1;

export function benchBatchRange(batch: number): { from: string; to: string } {
  const start = Date.UTC(BENCH_YEAR, 0, 1) + batch * 7 * 86_400_000;
  const day = (ms: number) => new Date(ms).toISOString().slice(0, 10);
  return { from: day(start), to: day(start + 6 * 86_400_000) };
}
