import type { Decimal } from 'decimal.js';
import { Dec, parseDecimalOrThrow, type DecimalInput } from './decimal.js';
import { ComputationError } from './errors.js';
import type { CostBreakdown } from './machine-cost.js';

export const COST_CATEGORIES = [
  'fuel',
  'repair',
  'parts',
  'tires',
  'insurance',
  'taxes',
  'housing',
  'interest',
  'improvement',
] as const;

export type CostCategory = (typeof COST_CATEGORIES)[number];

export interface MachineCostEntry {
  category: CostCategory;
  amount: DecimalInput;
  // Calendar year the money was spent.
  year: number;
  // Improvements only: years over which the outlay is written off.
  lifeYears?: number;
}

export interface ActualRateInput {
  year: number;
  hours: DecimalInput;
  acres?: DecimalInput | null;
  entries: readonly MachineCostEntry[];
}

export type CategoryAmounts = Record<CostCategory | 'total', Decimal>;

export interface ActualRate {
  year: number;
  perYear: CategoryAmounts;
  // null when the meter or the acre log shows no use that year.
  perHour: CategoryAmounts | null;
  perAcre: CategoryAmounts | null;
}

// An improvement (an overhaul, a new set of duals) serves several seasons, so
// each year carries an equal slice of it while it lasts, like straight-line
// depreciation; every other cost counts in the year it was paid.
function chargeInYearOrThrow(entry: MachineCostEntry, year: number): Decimal {
  const amount = parseDecimalOrThrow(entry.amount, 'amount');
  if (entry.category !== 'improvement') return entry.year === year ? amount : new Dec(0);
  const life = entry.lifeYears;
  if (life === undefined || !Number.isInteger(life) || life < 1) {
    throw new ComputationError('invalid-argument', 'an improvement needs a life of at least one whole year');
  }
  return year >= entry.year && year < entry.year + life ? amount.div(life) : new Dec(0);
}

function emptyAmounts(): CategoryAmounts {
  const amounts = { total: new Dec(0) } as CategoryAmounts;
  for (const category of COST_CATEGORIES) amounts[category] = new Dec(0);
  return amounts;
}

function divideAmounts(amounts: CategoryAmounts, divisor: Decimal | null): CategoryAmounts | null {
  if (divisor === null || divisor.lte(0)) return null;
  const divided = emptyAmounts();
  for (const key of [...COST_CATEGORIES, 'total'] as const) divided[key] = amounts[key].div(divisor);
  return divided;
}

// What the machine really cost to run in one year, from the costs logged
// against it and the hours (and acres) it worked.
export function actualMachineRateOrThrow(input: ActualRateInput): ActualRate {
  const perYear = emptyAmounts();
  for (const entry of input.entries) {
    const charge = chargeInYearOrThrow(entry, input.year);
    perYear[entry.category] = perYear[entry.category].plus(charge);
    perYear.total = perYear.total.plus(charge);
  }
  const hours = parseDecimalOrThrow(input.hours, 'hours');
  const acres = input.acres === undefined || input.acres === null ? null : parseDecimalOrThrow(input.acres, 'acres');
  return {
    year: input.year,
    perYear,
    perHour: divideAmounts(perYear, hours),
    perAcre: divideAmounts(perYear, acres),
  };
}

export type ComparedItem = 'repairs' | 'fuel-and-lube' | 'tih';

export interface ComparisonRow {
  item: ComparedItem;
  actual: Decimal;
  estimate: Decimal;
  // Positive when the machine cost more than the published method predicts.
  difference: Decimal;
}

// Only items both sides measure are set beside each other: the logged costs
// hold no depreciation of the machine itself, so capital recovery has no match.
export function compareWithEstimate(actual: CategoryAmounts, estimate: CostBreakdown): ComparisonRow[] {
  const pairs: [ComparedItem, Decimal, Decimal][] = [
    ['repairs', actual.repair.plus(actual.parts).plus(actual.tires), estimate.repairs],
    ['fuel-and-lube', actual.fuel, estimate.fuel.plus(estimate.lube)],
    ['tih', actual.taxes.plus(actual.insurance).plus(actual.housing), estimate.tih],
  ];
  return pairs.map(([item, actualValue, estimateValue]) => ({
    item,
    actual: actualValue,
    estimate: estimateValue,
    difference: actualValue.minus(estimateValue),
  }));
}
