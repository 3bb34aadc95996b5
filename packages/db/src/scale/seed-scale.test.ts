import { describe, expect, it } from 'vitest';
import { BENCH_BATCHES, BENCH_YEAR, benchBatchRange } from './accounts.js';
import { mulberry32, stableId } from './seed-scale.js';

describe('scale data generator', () => {
  it('gives the same ids for the same keys, shaped as version 4 uuids the API accepts', () => {
    const id = stableId('a:machine-power:0');
    expect(stableId('a:machine-power:0')).toBe(id);
    expect(stableId('b:machine-power:0')).not.toBe(id);
    expect(id).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
  });

  it('draws the same sequence from the same seed and another from another seed', () => {
    const draw = (seed: number) => {
      const next = mulberry32(seed);
      return Array.from({ length: 5 }, () => next());
    };
    expect(draw(20_161)).toEqual(draw(20_161));
    expect(draw(20_161)).not.toEqual(draw(31_337));
    for (const x of draw(7)) expect(x >= 0 && x < 1).toBe(true);
  });

  it('keeps the issuing batches in separate weeks of the year after the history', () => {
    const ranges = Array.from({ length: BENCH_BATCHES }, (_, i) => benchBatchRange(i));
    expect(ranges[0]).toEqual({ from: `${BENCH_YEAR}-01-01`, to: `${BENCH_YEAR}-01-07` });
    for (let i = 1; i < ranges.length; i++) expect(ranges[i]!.from > ranges[i - 1]!.to).toBe(true);
    expect(ranges.at(-1)!.to.startsWith(String(BENCH_YEAR))).toBe(true);
  });
});
