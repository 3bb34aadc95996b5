import { describe, expect, it } from 'vitest';
import { breakEvenAcresOrThrow, ownershipAdvantage, ownershipCost } from './break-even.js';
import { ComputationError } from './errors.js';

function near(actual: { toNumber(): number }, expected: number, tolerance: number): void {
  expect(Math.abs(actual.toNumber() - expected)).toBeLessThanOrEqual(tolerance);
}

describe('breakEvenAcresOrThrow', () => {
  it('breaks even at 58.8 acres: $1,000 fixed, $21 custom, $4 variable (Field & Solie, "Break-Even Use", Tables 10.2-10.4)', () => {
    near(breakEvenAcresOrThrow({ annualFixedCost: 1000, customRatePerAcre: 21, variableCostPerAcre: 4 }), 58.8, 0.1);
  });

  it('breaks even at 956 acres for the combine with the timeliness gain (Colorado State Fact Sheet 3.759, 2012)', () => {
    // $21,270 fixed; custom $16 + $8 timeliness; $8.75/h at 5 A/h = $1.75/A variable.
    near(breakEvenAcresOrThrow({ annualFixedCost: 21270, customRatePerAcre: 24, variableCostPerAcre: '1.75' }), 956, 0.5);
  });

  it('breaks even at 842 acres in Problem 1: $12,000 / (16 − 7/4) (Colorado State Fact Sheet 3.759, 2012)', () => {
    near(breakEvenAcresOrThrow({ annualFixedCost: 12000, customRatePerAcre: 16, variableCostPerAcre: '1.75' }), 842, 0.5);
  });

  it('refuses a custom rate that does not exceed the variable cost', () => {
    const call = () => breakEvenAcresOrThrow({ annualFixedCost: 1000, customRatePerAcre: 4, variableCostPerAcre: 4 });
    expect(call).toThrow(ComputationError);
    expect(call).toThrow(/custom rate must be above/);
  });
});

describe('ownershipAdvantage', () => {
  it('gains $825 at 900 acres in Problem 2 (Colorado State Fact Sheet 3.759, 2012)', () => {
    const value = ownershipAdvantage({ annualFixedCost: 12000, customRatePerAcre: 16, variableCostPerAcre: '1.75' }, 900);
    expect(value.toString()).toBe('825');
  });

  it('gains $5,430 at 1,200 acres in Example 3 with the timeliness gain (Colorado State Fact Sheet 3.759, 2012)', () => {
    const value = ownershipAdvantage({ annualFixedCost: 21270, customRatePerAcre: 24, variableCostPerAcre: '1.75' }, 1200);
    expect(value.toString()).toBe('5430');
  });
});

describe('ownershipCost', () => {
  it.each([
    ['1040', '104', 10],
    ['1200', '24', 50],
    ['1400', '14', 100],
    ['1800', '9', 200],
    ['3000', '6', 500],
  ])('comes to $%s a year and $%s an acre over %s acres with $1,000 fixed and $4/acre (Field & Solie, "Break-Even Use", Table 10.2)', (total, perAcre, acres) => {
    const cost = ownershipCost({ annualFixedCost: 1000, variableCostPerAcre: 4 }, acres);
    expect(cost.toString()).toBe(total);
    expect(cost.div(acres).toString()).toBe(perAcre);
  });
});
