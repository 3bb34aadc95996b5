import { describe, expect, it } from 'vitest';
import { actualMachineRateOrThrow, compareWithEstimate, type MachineCostEntry } from './actual-rate.js';
import { a329Tractor } from './a329-tractor.fixture.js';
import { estimateMachineCost } from './machine-cost.js';

// Invented log for one tractor; the arithmetic is checked by hand in each test.
function season(): MachineCostEntry[] {
  return [
    { category: 'fuel', amount: '9504.00', year: 2025 },
    { category: 'repair', amount: '1800.00', year: 2025 },
    { category: 'parts', amount: '420.50', year: 2025 },
    { category: 'tires', amount: '300.00', year: 2025 },
    { category: 'insurance', amount: '410.00', year: 2025 },
    { category: 'housing', amount: '250.00', year: 2025 },
    { category: 'interest', amount: '5200.00', year: 2025 },
    { category: 'improvement', amount: '6000.00', year: 2024, lifeYears: 3 },
    { category: 'repair', amount: '999.00', year: 2024 },
  ];
}

describe('actualMachineRateOrThrow', () => {
  it('totals one year of logged costs and writes improvements off straight-line', () => {
    const rate = actualMachineRateOrThrow({ year: 2025, hours: 400, acres: 5000, entries: season() });
    expect(rate.perYear.improvement.toString()).toBe('2000');
    expect(rate.perYear.repair.toString()).toBe('1800');
    expect(rate.perYear.total.toString()).toBe('19884.5');
    expect(rate.perHour?.total.toString()).toBe('49.71125');
    expect(rate.perAcre?.total.toString()).toBe('3.9769');
  });

  it('stops charging an improvement once its life is over', () => {
    const rate = actualMachineRateOrThrow({ year: 2027, hours: 400, entries: season() });
    expect(rate.perYear.improvement.isZero()).toBe(true);
    expect(rate.perYear.total.isZero()).toBe(true);
  });

  it('charges the improvement from its own year, not before', () => {
    const rate = actualMachineRateOrThrow({ year: 2023, hours: 400, entries: season() });
    expect(rate.perYear.improvement.isZero()).toBe(true);
  });

  it('gives no hourly or acre rate for a machine that stood idle or has no acre log', () => {
    const rate = actualMachineRateOrThrow({ year: 2025, hours: 0, entries: season() });
    expect(rate.perHour).toBeNull();
    expect(rate.perAcre).toBeNull();
  });

  it('needs a whole-year life on an improvement', () => {
    const entries: MachineCostEntry[] = [{ category: 'improvement', amount: '100', year: 2025 }];
    expect(() => actualMachineRateOrThrow({ year: 2025, hours: 1, entries })).toThrow(/life/);
  });
});

describe('compareWithEstimate', () => {
  it('sets repairs, fuel with lube, and TIH beside the published-method estimate', () => {
    // Iowa State A3-29 (2015) tractor with fuel at $3.00 (trade reference §6a):
    // estimate repairs $6.30/h, fuel + lube $27.324/h, TIH $2.05625/h.
    const estimate = estimateMachineCost(a329Tractor());
    const actual = actualMachineRateOrThrow({ year: 2025, hours: 400, entries: season() });
    const rows = compareWithEstimate(actual.perHour!, estimate.perHour);
    const byItem = Object.fromEntries(rows.map((row) => [row.item, row]));
    // Actual repairs (1800 + 420.50 + 300) / 400 = 6.30125 against 6.30.
    expect(byItem.repairs?.actual.toString()).toBe('6.30125');
    expect(byItem.repairs?.difference.toDecimalPlaces(5).toString()).toBe('0.00125');
    // Actual fuel 9504 / 400 = 23.76 against 23.76 + 3.564.
    expect(byItem['fuel-and-lube']?.difference.toDecimalPlaces(3).toString()).toBe('-3.564');
    // Actual TIH (410 + 250) / 400 = 1.65 against 822.50 / 400 = 2.05625.
    expect(byItem.tih?.difference.toDecimalPlaces(5).toString()).toBe('-0.40625');
  });
});
