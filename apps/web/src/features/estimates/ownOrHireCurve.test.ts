import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { ownCostPerAcre, ownOrHireCurve } from './ownOrHireCurve';

// Field & Solie, "Break-Even Use" (trade reference §9): fixed $1,000/yr, operating $4.00/acre,
// custom rate $21/acre; break-even 58.8 acres.
const fieldAndSolie = { annualFixedCost: '1000', customRatePerAcre: '21', variableCostPerAcre: '4' };

describe('own or hire curve', () => {
  it('reproduces the printed cost per acre at 50, 100, 200 and 500 acres', () => {
    expect(ownCostPerAcre(fieldAndSolie, 50).toFixed(2)).toBe('24.00');
    expect(ownCostPerAcre(fieldAndSolie, 100).toFixed(2)).toBe('14.00');
    expect(ownCostPerAcre(fieldAndSolie, 200).toFixed(2)).toBe('9.00');
    expect(ownCostPerAcre(fieldAndSolie, 500).toFixed(2)).toBe('6.00');
  });

  it('crosses the custom rate at the break-even acres', () => {
    const points = ownOrHireCurve(fieldAndSolie, '58.82');
    const atBreakEven = points.find((p) => p.acres === 58.8);
    expect(atBreakEven?.own).toBeCloseTo(21, 1);
    expect(atBreakEven?.hire).toBe(21);
  });

  it('makes owning dearer below the break-even and cheaper above it', () => {
    const points = ownOrHireCurve(fieldAndSolie, '58.82');
    for (const p of points) {
      if (p.acres < 58) expect(p.own).toBeGreaterThan(p.hire);
      if (p.acres > 60) expect(p.own).toBeLessThan(p.hire);
    }
  });

  it('plots from a quarter to three times the break-even, in increasing acres', () => {
    const acres = ownOrHireCurve(fieldAndSolie, '100').map((p) => p.acres);
    expect(acres[0]).toBe(25);
    expect(acres[acres.length - 1]).toBe(300);
    expect([...acres].sort((a, b) => a - b)).toEqual(acres);
  });

  it('still plots a range when there is no fixed cost to spread', () => {
    const points = ownOrHireCurve({ ...fieldAndSolie, annualFixedCost: '0' }, '0');
    expect(points.length).toBeGreaterThan(5);
    expect(points.every((p) => p.own === 4)).toBe(true);
  });

  it('keeps the exact decimal for the cost itself', () => {
    expect(ownCostPerAcre(fieldAndSolie, new Decimal('3')).toFixed(4)).toBe('337.3333');
  });
});
