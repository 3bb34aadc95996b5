import { describe, expect, it } from 'vitest';
import { PHOTO_BUDGET, photoBudgetLine, photoBudgetProblem } from './photoBudget';

const photo = (name: string, size: number) => ({ name, size });
const MB = 1024 * 1024;

describe('the photo budget of the phone', () => {
  it('takes up to three photos of up to 2 MB each', () => {
    expect(photoBudgetProblem([photo('a.jpg', 2 * MB), photo('b.jpg', MB), photo('c.jpg', 1)], 0)).toBeNull();
  });

  it('names what breaks the budget', () => {
    expect(photoBudgetProblem([1, 2, 3, 4].map((n) => photo(`${n}.jpg`, 10)), 0)).toBe('At most 3 photos per entry; remove 1.');
    expect(photoBudgetProblem([photo('gate.jpg', 2 * MB + 1)], 0)).toBe('gate.jpg is 2.0 MB; a photo kept on the phone may be at most 2.0 MB.');
    expect(photoBudgetProblem([photo('ditch.jpg', 2 * MB)], PHOTO_BUDGET.bytesOnPhone - MB)).toContain('would pass the 24.0 MB it keeps');
  });

  it('states the budget in words', () => {
    expect(photoBudgetLine(3.5 * MB)).toBe('Photos waiting on this phone: 3.5 MB of 24.0 MB. At most 3 photos per entry, 2.0 MB each.');
  });
});
