import type { Decimal } from 'decimal.js';
import { Dec, parseDecimalOrThrow, type DecimalInput } from './decimal.js';
import { ComputationError } from './errors.js';
import { formatMoney, roundToCent, toMoneyString } from './money.js';

export type RateUnit = 'acre' | 'hour' | 'mile' | 'load' | 'each';
// As the custom-rate surveys define them: a custom rate brings the machine, the
// tractor to pull it, fuel and operator; a rental is the machine alone.
export type ChargeType = 'custom' | 'rental';
export type RateSheetKind = 'family' | 'neighbour' | 'agency';

export interface MinimumCharge {
  amount: DecimalInput;
  // "visit": one minimum for all of a job's entries on the same trip to a farm.
  per: 'entry' | 'visit';
}

export interface OperatorTerms {
  wagePerHour: DecimalInput;
  // Labour hours per machine hour, covering travel, fuelling and greasing.
  laborFactor: DecimalInput;
}

export interface Rate {
  workTypeId: string;
  label: string;
  unit: RateUnit;
  chargeType: ChargeType;
  pricePerUnit: DecimalInput;
  minimumCharge?: MinimumCharge;
  // Rentals only: the owner can send someone to run the machine, billed as labour.
  operator?: OperatorTerms;
}

export interface FuelAdjustment {
  baseDieselPricePerGallon: DecimalInput;
  stepPerGallon: DecimalInput;
  change: { kind: 'percent'; pctPerStep: DecimalInput } | { kind: 'per-unit'; amountPerStep: DecimalInput };
}

export interface TravelCharge {
  flatPerVisit?: DecimalInput;
  perMile?: DecimalInput;
}

export interface PartyOverride {
  partyId: string;
  workTypeId: string;
  pricePerUnit?: DecimalInput;
  // null waives the sheet's minimum for this party.
  minimumCharge?: MinimumCharge | null;
}

export interface RateSheet {
  kind: RateSheetKind;
  rates: readonly Rate[];
  travel?: TravelCharge;
  fuelAdjustment?: FuelAdjustment;
  partyOverrides?: readonly PartyOverride[];
}

export interface WorkToPrice {
  entryId: string;
  workTypeId: string;
  // In the rate's unit: acres, hours, miles, loads or pieces.
  quantity: DecimalInput;
  machineHours?: DecimalInput;
  withOperator?: boolean;
}

// One trip to one party's place; a single work entry is a visit of one.
export interface Visit {
  visitId: string;
  partyId: string;
  dieselPricePerGallon?: DecimalInput;
  travelMiles?: DecimalInput;
  entries: readonly WorkToPrice[];
}

export type LineKind =
  | 'work'
  | 'fuel-adjustment'
  | 'operator-labor'
  | 'minimum-charge'
  | 'travel-flat'
  | 'travel-mileage';

// Every line obeys amount = quantity × unitPrice rounded half-up to the cent,
// so an invoice can print the three columns and the customer can check them.
export interface LineItem {
  kind: LineKind;
  entryId: string | null;
  workTypeId: string | null;
  label: string;
  quantity: string;
  unit: RateUnit | 'trip';
  unitPrice: string;
  amount: string;
}

export interface PricedVisit {
  visitId: string;
  partyId: string;
  sheetKind: RateSheetKind;
  lines: LineItem[];
  total: string;
}

export interface ResolvedRate {
  workTypeId: string;
  label: string;
  unit: RateUnit;
  chargeType: ChargeType;
  pricePerUnit: Decimal;
  minimumCharge: { amount: Decimal; per: 'entry' | 'visit' } | null;
  operator: { wagePerHour: Decimal; laborFactor: Decimal } | null;
}

export function resolveRateOrThrow(sheet: RateSheet, workTypeId: string, partyId: string): ResolvedRate {
  const rate = sheet.rates.find((candidate) => candidate.workTypeId === workTypeId);
  if (!rate) {
    throw new ComputationError('rate-not-found', `the rate sheet has no rate for work type "${workTypeId}"`);
  }
  const override = sheet.partyOverrides?.find(
    (candidate) => candidate.partyId === partyId && candidate.workTypeId === workTypeId,
  );
  const minimum = override && 'minimumCharge' in override ? override.minimumCharge : rate.minimumCharge;
  return {
    workTypeId,
    label: rate.label,
    unit: rate.unit,
    chargeType: rate.chargeType,
    pricePerUnit: parseDecimalOrThrow(override?.pricePerUnit ?? rate.pricePerUnit, 'pricePerUnit'),
    minimumCharge: minimum ? { amount: parseDecimalOrThrow(minimum.amount, 'minimumCharge'), per: minimum.per } : null,
    operator: rate.operator
      ? {
          wagePerHour: parseDecimalOrThrow(rate.operator.wagePerHour, 'wagePerHour'),
          laborFactor: parseDecimalOrThrow(rate.operator.laborFactor, 'laborFactor'),
        }
      : null,
  };
}

// Whole steps only, toward zero: with a $0.10 step, diesel $0.19 over base is
// one step and $0.19 under is minus one (common practice, no source).
export function fuelAdjustmentSteps(adjustment: FuelAdjustment, dieselPricePerGallon: DecimalInput): Decimal {
  const step = parseDecimalOrThrow(adjustment.stepPerGallon, 'stepPerGallon');
  if (step.lte(0)) throw new ComputationError('invalid-argument', 'the fuel price step must be above zero');
  return parseDecimalOrThrow(dieselPricePerGallon, 'dieselPricePerGallon')
    .minus(parseDecimalOrThrow(adjustment.baseDieselPricePerGallon, 'baseDieselPricePerGallon'))
    .div(step)
    .trunc();
}

// The fuel adjustment as a surcharge per unit of work, never so negative that
// the work would be done for less than nothing.
function fuelSurchargePerUnitOrThrow(sheet: RateSheet, rate: ResolvedRate, visit: Visit): Decimal {
  const adjustment = sheet.fuelAdjustment;
  // Rentals leave fuel to the customer, so diesel prices do not move them.
  if (!adjustment || rate.chargeType === 'rental') return new Dec(0);
  if (visit.dieselPricePerGallon === undefined) {
    throw new ComputationError('missing-diesel-price', 'this rate sheet adjusts for fuel; give the diesel price of the visit');
  }
  const steps = fuelAdjustmentSteps(adjustment, visit.dieselPricePerGallon);
  const surcharge =
    adjustment.change.kind === 'percent'
      ? rate.pricePerUnit.times(steps).times(parseDecimalOrThrow(adjustment.change.pctPerStep, 'pctPerStep')).div(100)
      : steps.times(parseDecimalOrThrow(adjustment.change.amountPerStep, 'amountPerStep'));
  return Dec.max(surcharge, rate.pricePerUnit.neg());
}

function fuelLabel(sheet: RateSheet, visit: Visit): string {
  const base = sheet.fuelAdjustment?.baseDieselPricePerGallon ?? 0;
  return `Fuel adjustment, diesel ${formatMoney(visit.dieselPricePerGallon ?? 0)}/gal against ${formatMoney(base)} base`;
}

function line(
  kind: LineKind,
  ids: { entryId: string | null; workTypeId: string | null },
  label: string,
  quantity: Decimal,
  unit: LineItem['unit'],
  unitPrice: Decimal,
): LineItem {
  return {
    kind,
    ...ids,
    label,
    quantity: quantity.toString(),
    unit,
    unitPrice: unitPrice.toString(),
    amount: toMoneyString(roundToCent(quantity.times(unitPrice))),
  };
}

function sumLines(lines: readonly LineItem[]): Decimal {
  return lines.reduce<Decimal>((sum, item) => sum.plus(item.amount), new Dec(0));
}

function minimumTopUp(
  minimum: Decimal,
  earned: Decimal,
  ids: { entryId: string | null; workTypeId: string | null },
): LineItem | null {
  if (earned.gte(minimum)) return null;
  return line('minimum-charge', ids, `Minimum charge ${formatMoney(minimum)}`, new Dec(1), 'each', minimum.minus(earned));
}

function operatorLineOrThrow(rate: ResolvedRate, entry: WorkToPrice): LineItem | null {
  // Custom work already includes the operator in its rate.
  if (!entry.withOperator || rate.chargeType === 'custom') return null;
  if (!rate.operator) {
    throw new ComputationError('invalid-argument', `the rental "${rate.label}" comes without an operator`);
  }
  const machineHours = entry.machineHours ?? (rate.unit === 'hour' ? entry.quantity : undefined);
  if (machineHours === undefined) {
    throw new ComputationError('missing-machine-hours', `entry ${entry.entryId}: give machine hours to bill the operator`);
  }
  const laborHours = parseDecimalOrThrow(machineHours, 'machineHours').times(rate.operator.laborFactor);
  return line(
    'operator-labor',
    { entryId: entry.entryId, workTypeId: rate.workTypeId },
    `Operator, ${machineHours.toString()} machine h × ${rate.operator.laborFactor.toString()}`,
    laborHours,
    'hour',
    rate.operator.wagePerHour,
  );
}

// Prices one visit: for each entry its work, fuel adjustment, operator and
// per-entry minimum; then per-visit minimums by work type; then travel.
// The minimum is the least the machine work itself (with fuel) must earn.
export function priceVisitOrThrow(sheet: RateSheet, visit: Visit): PricedVisit {
  const lines: LineItem[] = [];
  const visitEarnings = new Map<string, { minimum: Decimal; earned: Decimal }>();

  for (const entry of visit.entries) {
    const rate = resolveRateOrThrow(sheet, entry.workTypeId, visit.partyId);
    const quantity = parseDecimalOrThrow(entry.quantity, 'quantity');
    if (quantity.isNegative() && !quantity.isZero()) {
      throw new ComputationError('invalid-argument', `entry ${entry.entryId}: quantity must not be negative`);
    }
    const ids = { entryId: entry.entryId, workTypeId: rate.workTypeId };
    const workLine = line('work', ids, rate.label, quantity, rate.unit, rate.pricePerUnit);
    const machineLines = [workLine];
    const surcharge = fuelSurchargePerUnitOrThrow(sheet, rate, visit);
    if (!surcharge.isZero()) {
      // Taken as the difference of the rounded totals, so work plus fuel is
      // always the adjusted price times the quantity, rounded once.
      const adjusted = roundToCent(quantity.times(rate.pricePerUnit.plus(surcharge)));
      const difference = adjusted.minus(workLine.amount);
      machineLines.push(line('fuel-adjustment', ids, fuelLabel(sheet, visit), new Dec(1), 'each', difference));
    }
    lines.push(...machineLines);
    const operator = operatorLineOrThrow(rate, entry);
    if (operator) lines.push(operator);

    const earned = sumLines(machineLines);
    if (rate.minimumCharge?.per === 'entry') {
      const topUp = minimumTopUp(rate.minimumCharge.amount, earned, ids);
      if (topUp) lines.push(topUp);
    } else if (rate.minimumCharge?.per === 'visit') {
      const soFar = visitEarnings.get(rate.workTypeId)?.earned ?? new Dec(0);
      visitEarnings.set(rate.workTypeId, { minimum: rate.minimumCharge.amount, earned: soFar.plus(earned) });
    }
  }

  for (const [workTypeId, { minimum, earned }] of visitEarnings) {
    const topUp = minimumTopUp(minimum, earned, { entryId: null, workTypeId });
    if (topUp) lines.push(topUp);
  }

  lines.push(...travelLines(sheet.travel, visit));
  return {
    visitId: visit.visitId,
    partyId: visit.partyId,
    sheetKind: sheet.kind,
    lines,
    total: toMoneyString(sumLines(lines)),
  };
}

function travelLines(travel: TravelCharge | undefined, visit: Visit): LineItem[] {
  const noIds = { entryId: null, workTypeId: null };
  const lines: LineItem[] = [];
  if (travel?.flatPerVisit !== undefined) {
    const flat = parseDecimalOrThrow(travel.flatPerVisit, 'flatPerVisit');
    if (!flat.isZero()) lines.push(line('travel-flat', noIds, 'Travel', new Dec(1), 'trip', flat));
  }
  if (travel?.perMile !== undefined && visit.travelMiles !== undefined) {
    const miles = parseDecimalOrThrow(visit.travelMiles, 'travelMiles');
    if (!miles.isZero()) {
      lines.push(line('travel-mileage', noIds, 'Mileage', miles, 'mile', parseDecimalOrThrow(travel.perMile, 'perMile')));
    }
  }
  return lines;
}
