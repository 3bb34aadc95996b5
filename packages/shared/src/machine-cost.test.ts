import { describe, expect, it } from 'vitest';
import { a329Tractor } from './a329-tractor.fixture.js';
import { acresPerHour } from './field-capacity.js';
import { machineClassOrThrow, remainingValueCoefficientsOrThrow } from './machine-classes.js';
import {
  accumulatedRepairCost,
  capitalRecovery,
  capitalRecoveryFactor,
  estimateMachineCost,
  fuelGallonsPerHour,
  perAcreOrThrow,
  remainingValueFraction,
  repairCostBetween,
  straightLineWithInterest,
} from './machine-cost.js';

function near(actual: { toNumber(): number }, expected: number, tolerance: number): void {
  expect(Math.abs(actual.toNumber() - expected)).toBeLessThanOrEqual(tolerance);
}

const tractor2wd = machineClassOrThrow('tractor-2wd');

describe('capitalRecoveryFactor', () => {
  it.each([
    ['0.08', 10, 0.14903],
    ['0.06', 10, 0.13587],
    ['0.08', 14, 0.1213],
  ])('matches the tabulated CRF at %s over %i years (engineersedge CRF table, via trade reference §4 [C])', (rate, years, expected) => {
    near(capitalRecoveryFactor(rate, years), expected, 0.000005);
  });

  it('gives 0.117 at 8 % over 15 years, the table value A3-29 uses (trade reference §6a; table value from memory)', () => {
    near(capitalRecoveryFactor('0.08', 15), 0.117, 0.0005);
  });

  it('falls back to 1/n at zero interest (limit of the CRF formula, common practice, no source)', () => {
    expect(capitalRecoveryFactor(0, 8).toString()).toBe('0.125');
  });

  it('refuses a fractional or zero number of years', () => {
    expect(() => capitalRecoveryFactor('0.05', 0)).toThrow(/at least 1/);
    expect(() => capitalRecoveryFactor('0.05', 2.5)).toThrow(/whole number/);
  });
});

describe('ownership cost', () => {
  it('gives $7,835.54 capital recovery for the older A3-29 tractor (Iowa State A3-29 older edition inputs; computed, trade reference §6b [C-calc])', () => {
    const value = capitalRecovery({ purchasePrice: '93500', salvageValue: '25300', rate: '0.05', years: 15 });
    near(value, 7835.54, 0.01);
  });

  it('gives $13,917.22 capital recovery for the 2015 A3-29 tractor (A3-29 2015 inputs; computed, trade reference §6a [C-calc])', () => {
    near(capitalRecovery({ purchasePrice: '130000', salvageValue: '34500', rate: '0.08', years: 15 }), 13917.22, 0.01);
  });

  it('gives $12,946.67 by straight line plus interest on the average (A3-29 2015 inputs; computed, trade reference §6a [C-calc])', () => {
    near(straightLineWithInterest({ purchasePrice: '130000', salvageValue: '34500', rate: '0.08', years: 15 }), 12946.67, 0.01);
  });
});

describe('remainingValueFraction', () => {
  it('leaves a >150 hp tractor at 22.76 % of list after 15 years at 400 h (A3-29 prints 23 %; coefficients from memory, trade reference §2)', () => {
    const fraction = remainingValueFraction(remainingValueCoefficientsOrThrow(tractor2wd, 180), 15, 400);
    near(fraction.times(100), 22.76, 0.5);
    near(fraction.times(100), 23, 0.5);
  });

  it('leaves a 105 hp tractor at 37 % after 10 years at 400 h (Iowa chart via Growing Produce part 1 reprint; coefficients from memory)', () => {
    const fraction = remainingValueFraction(remainingValueCoefficientsOrThrow(tractor2wd, 105), 10, 400);
    near(fraction.times(100), 37, 0.5);
  });

  it('does not let value return once the curve runs out', () => {
    const disk = remainingValueCoefficientsOrThrow(machineClassOrThrow('tandem-disk'), null);
    expect(remainingValueFraction(disk, 64, 0).isPositive()).toBe(true);
    expect(remainingValueFraction(disk, 70, 0).isZero()).toBe(true);
  });
});

describe('repair cost', () => {
  const factors = { rf1: tractor2wd.rf1, rf2: tractor2wd.rf2 };

  it('accumulates $37,800 over 6,000 h on a $150,000 2WD tractor, $6.30/h (D497 formula; coefficients from memory, trade reference §1)', () => {
    const total = accumulatedRepairCost(factors, '150000', 6000);
    near(total, 37800, 1);
    near(total.div(6000), 6.3, 0.01);
  });

  it('costs $3,192 between 3,600 and 4,000 h, the tenth year (D497 formula; coefficients from memory, trade reference §1 [C-calc])', () => {
    near(repairCostBetween(factors, '150000', 3600, 4000), 3192, 1);
  });

  it('comes to about 25 % of an $80,000 list over 6,000 h, $3.33/h (Growing Produce part 2, Iowa chart read to the whole percent)', () => {
    // The chart is read to the nearest whole percent, so ±0.5 point of list
    // (±$400, ±$0.07/h) is the reading's own precision.
    const total = accumulatedRepairCost(factors, '80000', 6000);
    near(total.div(80000).times(100), 25, 0.5);
    near(total.div(6000), 3.33, 0.07);
  });

  it('refuses a later meter reading below the earlier one', () => {
    expect(() => repairCostBetween(factors, '150000', 4000, 3600)).toThrow(/meter reading/);
  });
});

describe('fuel', () => {
  it('burns 4.62 gal/h in a 105 max-PTO-hp diesel (ASAE EP496.3 §6.3.2.1 via Grisso, Predicting Diesel Fuel Consumption)', () => {
    near(fuelGallonsPerHour('diesel', 105), 4.62, 0.005);
  });

  it('uses 0.060 gal/hp·h for gasoline (Growing Produce reprint of A3-29) and 0.072 for LPG (from memory)', () => {
    expect(fuelGallonsPerHour('gasoline', 100).toString()).toBe('6');
    expect(fuelGallonsPerHour('lpg', 100).toString()).toBe('7.2');
  });
});

describe('estimateMachineCost', () => {
  it('costs $86.97 per tractor hour: ownership $36.85 + operating $50.12 (A3-29 2015 inputs; computed, trade reference §6a [C-calc])', () => {
    const estimate = estimateMachineCost(a329Tractor());
    near(estimate.perHour.total, 86.97, 0.05);
    near(estimate.perHour.ownership, 36.85, 0.005);
    near(estimate.perHour.operating, 50.12, 0.005);
  });

  it('itemises the §6a hour: repairs $6.30, 7.92 gal, fuel $23.76, lube $3.56, labour $16.50, TIH $822.50/yr (A3-29 inputs; computed, trade reference §6a)', () => {
    const estimate = estimateMachineCost(a329Tractor());
    near(estimate.perHour.repairs, 6.3, 0.005);
    near(estimate.fuelGallonsPerHour, 7.92, 0.0005);
    near(estimate.perHour.fuel, 23.76, 0.005);
    near(estimate.perHour.lube, 3.564, 0.0005);
    near(estimate.perHour.labor, 16.5, 0.005);
    near(estimate.perYear.tih, 822.5, 0.005);
    near(estimate.perYear.capitalRecovery, 13917.22, 0.01);
    near(estimate.capitalRecoveryFactor, 0.1168295, 0.0000001);
  });

  it('reports the salvage given as 23 % of list (A3-29 2015: salvage 23 % of $150,000 = $34,500)', () => {
    const estimate = estimateMachineCost(a329Tractor());
    expect(estimate.salvageValue.toString()).toBe('34500');
    expect(estimate.remainingValuePct.toString()).toBe('23');
  });

  it('takes salvage from the curve when none is given: 22.76 % → $34,146 (trade reference §2 worked example [C-calc]; coefficients from memory)', () => {
    const estimate = estimateMachineCost(a329Tractor({ salvageValue: null }));
    near(estimate.remainingValuePct, 22.76, 0.005);
    near(estimate.salvageValue, 34146, 1);
  });

  it('switches to straight line plus interest on request (A3-29 inputs; computed, trade reference §6a)', () => {
    const estimate = estimateMachineCost(a329Tractor({ method: 'straight-line' }));
    near(estimate.perYear.capitalRecovery, 12946.67, 0.01);
  });

  it('costs the §6a tractor at $4.02 per acre behind a 30-ft field cultivator at 7 mph and 85 % (A3-29 + A3-24 inputs; computed, trade reference §6a)', () => {
    const estimate = estimateMachineCost(a329Tractor());
    const capacity = acresPerHour({ widthFt: 30, speedMph: 7, efficiencyPct: 85 });
    near(capacity, 21.636, 0.001);
    near(perAcreOrThrow(estimate.perHour, capacity).total, 4.02, 0.005);
  });

  it('prices fuel at $15.71/h and lube at $2.36/h for the 105 hp example at $3.40 (Growing Produce part 2)', () => {
    const estimate = estimateMachineCost(
      a329Tractor({ engine: { ptoHp: 105, fuelType: 'diesel', fuelPricePerGallon: '3.40' } }),
    );
    near(estimate.perHour.fuel, 15.71, 0.01);
    near(estimate.perHour.lube, 2.36, 0.01);
  });

  it('charges $14.85/h labour at $13.50 and factor 1.1 (farmdoc, Machinery Cost Estimates: Tractors, 2008)', () => {
    const estimate = estimateMachineCost(a329Tractor({ laborWagePerHour: '13.50', laborFactor: '1.1' }));
    near(estimate.perHour.labor, 14.85, 0.005);
  });

  it('spreads the repairs of a used machine from its meter reading on (D497 formula; year 10 of §1 [C-calc], coefficients from memory)', () => {
    const estimate = estimateMachineCost(a329Tractor({ hoursAtPurchase: 3600, yearsOwned: 1, ageAtPurchase: 9 }));
    near(estimate.perYear.repairs, 3192, 1);
  });

  it('ages a used machine from its build year, not its purchase', () => {
    const used = estimateMachineCost(a329Tractor({ salvageValue: null, yearsOwned: 5, ageAtPurchase: 10 }));
    const fromNew = estimateMachineCost(a329Tractor({ salvageValue: null }));
    expect(used.remainingValuePct.eq(fromNew.remainingValuePct)).toBe(true);
  });

  it('charges no fuel or lube for an implement', () => {
    const estimate = estimateMachineCost(a329Tractor({ engine: null }));
    expect(estimate.perYear.fuel.isZero()).toBe(true);
    expect(estimate.perYear.lube.isZero()).toBe(true);
    expect(estimate.fuelGallonsPerHour.isZero()).toBe(true);
  });

  it('keeps totals equal to the sum of their parts and hours consistent with years', () => {
    const estimate = estimateMachineCost(a329Tractor({ salvageValue: null, hoursAtPurchase: 1234 }));
    const { perYear, perHour } = estimate;
    expect(perYear.ownership.eq(perYear.capitalRecovery.plus(perYear.tih))).toBe(true);
    expect(perYear.operating.eq(perYear.repairs.plus(perYear.fuel).plus(perYear.lube).plus(perYear.labor))).toBe(true);
    expect(perYear.total.eq(perYear.ownership.plus(perYear.operating))).toBe(true);
    expect(perHour.total.times(400).minus(perYear.total).abs().lt('1e-20')).toBe(true);
  });

  it('refuses zero hours a year and a zero field capacity', () => {
    expect(() => estimateMachineCost(a329Tractor({ hoursPerYear: 0 }))).toThrow(/hoursPerYear/);
    expect(() => perAcreOrThrow(estimateMachineCost(a329Tractor()).perHour, 0)).toThrow(/acresPerHour/);
  });
});
