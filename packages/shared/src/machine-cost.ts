import type { Decimal } from 'decimal.js';
import { Dec, parseDecimalOrThrow, type DecimalInput } from './decimal.js';
import { ComputationError } from './errors.js';
import type { RemainingValueCoefficients } from './machine-classes.js';

export type FuelType = 'diesel' | 'gasoline' | 'lpg';
export type OwnershipMethod = 'capital-recovery' | 'straight-line';

// Average fuel use per maximum PTO horsepower per hour over a year of mixed
// work: diesel per ASAE EP496.3 §6.3.2.1; gasoline per Iowa State A3-29 as
// reprinted; LPG recalled (trade reference §3, [M]).
export const FUEL_GALLONS_PER_PTO_HP_HOUR: Record<FuelType, string> = {
  diesel: '0.044',
  gasoline: '0.060',
  lpg: '0.072',
};

function percent(value: DecimalInput, what: string): Decimal {
  return parseDecimalOrThrow(value, what).div(100);
}

// ASABE D497 remaining value as a fraction of the current list price of an
// equivalent new machine: (c1 − c2·√age − c3·√(hours per year))². Past the end
// of the curve the bracket turns negative; squaring would resurrect value, so
// the machine is worth nothing there instead.
export function remainingValueFraction(
  coefficients: RemainingValueCoefficients,
  ageYears: DecimalInput,
  hoursPerYear: DecimalInput,
): Decimal {
  const bracket = parseDecimalOrThrow(coefficients.c1, 'c1')
    .minus(parseDecimalOrThrow(coefficients.c2, 'c2').times(parseDecimalOrThrow(ageYears, 'age').sqrt()))
    .minus(parseDecimalOrThrow(coefficients.c3, 'c3').times(parseDecimalOrThrow(hoursPerYear, 'hoursPerYear').sqrt()));
  return bracket.isPositive() ? bracket.pow(2) : new Dec(0);
}

// CRF = i(1+i)^n / ((1+i)^n − 1); at zero interest it is simply 1/n.
export function capitalRecoveryFactor(rate: DecimalInput, years: number): Decimal {
  if (!Number.isInteger(years) || years < 1) {
    throw new ComputationError('invalid-argument', 'years must be a whole number of at least 1');
  }
  const i = parseDecimalOrThrow(rate, 'rate');
  if (i.isZero()) return new Dec(1).div(years);
  const growth = i.plus(1).pow(years);
  return i.times(growth).div(growth.minus(1));
}

export interface OwnershipInputs {
  purchasePrice: DecimalInput;
  salvageValue: DecimalInput;
  rate: DecimalInput;
  years: number;
}

// Depreciation and interest together, as an annuity: (P − S)·CRF + S·i.
export function capitalRecovery({ purchasePrice, salvageValue, rate, years }: OwnershipInputs): Decimal {
  const purchase = parseDecimalOrThrow(purchasePrice, 'purchasePrice');
  const salvage = parseDecimalOrThrow(salvageValue, 'salvageValue');
  const i = parseDecimalOrThrow(rate, 'rate');
  return purchase.minus(salvage).times(capitalRecoveryFactor(i, years)).plus(salvage.times(i));
}

// Straight-line depreciation plus interest on the average investment:
// (P − S)/n + i·(P + S)/2.
export function straightLineWithInterest({ purchasePrice, salvageValue, rate, years }: OwnershipInputs): Decimal {
  const purchase = parseDecimalOrThrow(purchasePrice, 'purchasePrice');
  const salvage = parseDecimalOrThrow(salvageValue, 'salvageValue');
  const i = parseDecimalOrThrow(rate, 'rate');
  return purchase.minus(salvage).div(years).plus(i.times(purchase.plus(salvage)).div(2));
}

export interface RepairFactors {
  rf1: DecimalInput;
  rf2: DecimalInput;
}

// ASABE D497 accumulated repair and maintenance from new: RF1·list·(h/1000)^RF2.
export function accumulatedRepairCost(factors: RepairFactors, listPrice: DecimalInput, hours: DecimalInput): Decimal {
  const thousands = parseDecimalOrThrow(hours, 'hours').div(1000);
  return parseDecimalOrThrow(factors.rf1, 'rf1')
    .times(parseDecimalOrThrow(listPrice, 'listPrice'))
    .times(thousands.pow(parseDecimalOrThrow(factors.rf2, 'rf2')));
}

// Repairs rise with age, so the cost of a stretch of use is the difference of
// the accumulated curve at its two meter readings, not a life average.
export function repairCostBetween(
  factors: RepairFactors,
  listPrice: DecimalInput,
  fromHours: DecimalInput,
  toHours: DecimalInput,
): Decimal {
  if (parseDecimalOrThrow(toHours, 'toHours').lt(parseDecimalOrThrow(fromHours, 'fromHours'))) {
    throw new ComputationError('invalid-argument', 'the later meter reading must not be below the earlier one');
  }
  return accumulatedRepairCost(factors, listPrice, toHours).minus(accumulatedRepairCost(factors, listPrice, fromHours));
}

export function fuelGallonsPerHour(fuelType: FuelType, ptoHp: DecimalInput): Decimal {
  return new Dec(FUEL_GALLONS_PER_PTO_HP_HOUR[fuelType]).times(parseDecimalOrThrow(ptoHp, 'ptoHp'));
}

export interface EngineInputs {
  ptoHp: DecimalInput;
  fuelType: FuelType;
  fuelPricePerGallon: DecimalInput;
}

export interface MachineCostInputs {
  repairFactors: RepairFactors;
  remainingValue: RemainingValueCoefficients;
  listPrice: DecimalInput;
  purchasePrice: DecimalInput;
  yearsOwned: number;
  hoursPerYear: DecimalInput;
  ageAtPurchase: number;
  hoursAtPurchase: DecimalInput;
  interestRatePct: DecimalInput;
  tihPct: DecimalInput;
  // Overrides the remaining-value curve when the owner knows the trade-in value.
  salvageValue: DecimalInput | null;
  // null for implements: their fuel is burned by the tractor and costed there.
  engine: EngineInputs | null;
  lubePct: DecimalInput;
  laborWagePerHour: DecimalInput;
  laborFactor: DecimalInput;
  method: OwnershipMethod;
}

export interface CostBreakdown {
  capitalRecovery: Decimal;
  tih: Decimal;
  ownership: Decimal;
  repairs: Decimal;
  fuel: Decimal;
  lube: Decimal;
  labor: Decimal;
  operating: Decimal;
  total: Decimal;
}

export const COST_BREAKDOWN_KEYS = [
  'capitalRecovery',
  'tih',
  'ownership',
  'repairs',
  'fuel',
  'lube',
  'labor',
  'operating',
  'total',
] as const satisfies readonly (keyof CostBreakdown)[];

export interface MachineCostEstimate {
  remainingValuePct: Decimal;
  salvageValue: Decimal;
  capitalRecoveryFactor: Decimal;
  fuelGallonsPerHour: Decimal;
  perYear: CostBreakdown;
  perHour: CostBreakdown;
}

function mapBreakdown(breakdown: CostBreakdown, map: (value: Decimal) => Decimal): CostBreakdown {
  const mapped = {} as CostBreakdown;
  for (const key of COST_BREAKDOWN_KEYS) mapped[key] = map(breakdown[key]);
  return mapped;
}

// The published-method (ASABE D497/EP496, as laid out in Iowa State AgDM A3-29)
// yearly and hourly cost of owning and running one machine.
export function estimateMachineCost(inputs: MachineCostInputs): MachineCostEstimate {
  const list = parseDecimalOrThrow(inputs.listPrice, 'listPrice');
  const purchase = parseDecimalOrThrow(inputs.purchasePrice, 'purchasePrice');
  const hoursPerYear = parseDecimalOrThrow(inputs.hoursPerYear, 'hoursPerYear');
  const years = inputs.yearsOwned;
  const rate = percent(inputs.interestRatePct, 'interestRatePct');
  if (hoursPerYear.lte(0)) {
    throw new ComputationError('invalid-argument', 'hoursPerYear must be above zero');
  }

  const curveFraction = remainingValueFraction(inputs.remainingValue, inputs.ageAtPurchase + years, hoursPerYear);
  const salvage =
    inputs.salvageValue === null ? curveFraction.times(list) : parseDecimalOrThrow(inputs.salvageValue, 'salvageValue');
  const remainingValuePct = salvage.div(list).times(100);

  const crf = capitalRecoveryFactor(rate, years);
  const ownershipInputs = { purchasePrice: purchase, salvageValue: salvage, rate, years };
  const capital =
    inputs.method === 'capital-recovery' ? capitalRecovery(ownershipInputs) : straightLineWithInterest(ownershipInputs);
  const tih = percent(inputs.tihPct, 'tihPct').times(purchase.plus(salvage)).div(2);

  const h0 = parseDecimalOrThrow(inputs.hoursAtPurchase, 'hoursAtPurchase');
  const h1 = h0.plus(hoursPerYear.times(years));
  const repairs = repairCostBetween(inputs.repairFactors, list, h0, h1).div(years);

  const gallonsPerHour = inputs.engine ? fuelGallonsPerHour(inputs.engine.fuelType, inputs.engine.ptoHp) : new Dec(0);
  const fuelPerHour = inputs.engine
    ? gallonsPerHour.times(parseDecimalOrThrow(inputs.engine.fuelPricePerGallon, 'fuelPricePerGallon'))
    : new Dec(0);
  const fuel = fuelPerHour.times(hoursPerYear);
  const lube = fuel.times(percent(inputs.lubePct, 'lubePct'));
  const labor = parseDecimalOrThrow(inputs.laborWagePerHour, 'laborWagePerHour')
    .times(parseDecimalOrThrow(inputs.laborFactor, 'laborFactor'))
    .times(hoursPerYear);

  const ownership = capital.plus(tih);
  const operating = repairs.plus(fuel).plus(lube).plus(labor);
  const perYear: CostBreakdown = {
    capitalRecovery: capital,
    tih,
    ownership,
    repairs,
    fuel,
    lube,
    labor,
    operating,
    total: ownership.plus(operating),
  };

  return {
    remainingValuePct,
    salvageValue: salvage,
    capitalRecoveryFactor: crf,
    fuelGallonsPerHour: gallonsPerHour,
    perYear,
    perHour: mapBreakdown(perYear, (value) => value.div(hoursPerYear)),
  };
}

export function perAcreOrThrow(perHour: CostBreakdown, acresPerHour: DecimalInput): CostBreakdown {
  const capacity = parseDecimalOrThrow(acresPerHour, 'acresPerHour');
  if (capacity.lte(0)) {
    throw new ComputationError('invalid-argument', 'acresPerHour must be above zero');
  }
  return mapBreakdown(perHour, (value) => value.div(capacity));
}
