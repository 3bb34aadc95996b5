import { machineClassOrThrow, remainingValueCoefficientsOrThrow } from './machine-classes.js';
import type { MachineCostInputs } from './machine-cost.js';

// Iowa State AgDM A3-29 (2015) tractor: 180 max-PTO hp diesel, list $150,000,
// purchase $130,000, 15 years, 8 %, 400 h/yr, salvage 23 % of list. Fuel
// $3.00/gal and wage $15.00/h are the trade reference's test choices (§6a).
// A fresh object on every call, so no test can leak changes into another.
export function a329Tractor(overrides: Partial<MachineCostInputs> = {}): MachineCostInputs {
  const tractor = machineClassOrThrow('tractor-2wd');
  return {
    repairFactors: { rf1: tractor.rf1, rf2: tractor.rf2 },
    remainingValue: remainingValueCoefficientsOrThrow(tractor, 180),
    listPrice: '150000',
    purchasePrice: '130000',
    yearsOwned: 15,
    hoursPerYear: 400,
    ageAtPurchase: 0,
    hoursAtPurchase: 0,
    interestRatePct: '8',
    tihPct: '1',
    salvageValue: '34500',
    engine: { ptoHp: 180, fuelType: 'diesel', fuelPricePerGallon: '3.00' },
    lubePct: '15',
    laborWagePerHour: '15.00',
    laborFactor: '1.1',
    method: 'capital-recovery',
    ...overrides,
  };
}
