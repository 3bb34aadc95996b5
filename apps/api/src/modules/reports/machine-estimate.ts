import { Dec, fixed } from '@hitchbook/shared/decimal';
import { ComputationError } from '@hitchbook/shared/errors';
import { hasEngine, machineClassOrThrow, remainingValueCoefficientsOrThrow, type MachineClass } from '@hitchbook/shared/machine-classes';
import { estimateMachineCost, type FuelType, type MachineCostEstimate, type MachineCostInputs } from '@hitchbook/shared/machine-cost';
import type { EstimateInputDto } from '@hitchbook/shared/schemas/reports';
import type { MachineRow } from './machine-year.repository.js';

// The published-method estimate fed with the machine's own record, its year's logs and the family rate
// sheet, falling back to class and method defaults; every input used is listed with where it came from.

/** Diesel price when no fuel ticket of the year recorded gallons: Iowa State AgDM A3-10, 2025 survey's assumption. */
export const FALLBACK_FUEL_PRICE = '3.66';
/** Iowa State AgDM A3-29: economic life 15 years for tractors, 10–12 for most other machines. */
const DEFAULT_YEARS_OWNED = { power: 15, other: 12 } as const;
const DEFAULT_TIH_PCT = '1';
const DEFAULT_LUBE_PCT = '15';
const DEFAULT_LABOR_FACTOR = '1.1';

export interface EstimateContext {
  year: number;
  /** Hours the machine worked in the year (counted entries). */
  yearHours: string;
  /** Average price per gallon on the machine's own tickets, then the fleet's; null when no ticket recorded gallons. */
  machineFuelPrice: string | null;
  fleetFuelPrice: string | null;
  interestRatePct: string;
  interestFromQuery: boolean;
  familySheet: { operatorWage: string; laborFactor: string } | null;
}

export type MachineEstimateResult =
  | { available: true; estimate: MachineCostEstimate; inputs: EstimateInputDto[] }
  | { available: false; reason: string; inputs: EstimateInputDto[] };

class Inputs {
  readonly list: EstimateInputDto[] = [];
  add(name: string, value: string | number, source: EstimateInputDto['source']): string {
    this.list.push({ name, value: String(value), source });
    return String(value);
  }
}

function yearsOwned(machine: MachineRow, machineClass: MachineClass, inputs: Inputs): number {
  if (machine.plannedYearsOwned !== null) return Number(inputs.add('yearsOwned', machine.plannedYearsOwned, 'machine'));
  return Number(inputs.add('yearsOwned', machineClass.kind === 'power' ? DEFAULT_YEARS_OWNED.power : DEFAULT_YEARS_OWNED.other, 'class-default'));
}

function hoursPerYear(machine: MachineRow, machineClass: MachineClass, years: number, context: EstimateContext, inputs: Inputs): string {
  if (machine.plannedHoursPerYear !== null && new Dec(machine.plannedHoursPerYear).gt(0)) return inputs.add('hoursPerYear', machine.plannedHoursPerYear, 'machine');
  if (new Dec(context.yearHours).gt(0)) return inputs.add('hoursPerYear', context.yearHours, 'year-records');
  return inputs.add('hoursPerYear', fixed(new Dec(machineClass.lifeHours).div(years), 1), 'class-default');
}

function ageAtPurchase(machine: MachineRow, inputs: Inputs): number {
  const bought = machine.purchaseDate ? Number(machine.purchaseDate.slice(0, 4)) : null;
  if (bought !== null && machine.modelYear !== null && bought >= machine.modelYear) return Number(inputs.add('ageAtPurchase', bought - machine.modelYear, 'machine'));
  return Number(inputs.add('ageAtPurchase', 0, 'method-default'));
}

function fuelPrice(context: EstimateContext, inputs: Inputs): string {
  if (context.machineFuelPrice !== null) return inputs.add('fuelPricePerGallon', context.machineFuelPrice, 'year-records');
  if (context.fleetFuelPrice !== null) return inputs.add('fuelPricePerGallon', context.fleetFuelPrice, 'year-records');
  return inputs.add('fuelPricePerGallon', FALLBACK_FUEL_PRICE, 'method-default');
}

export function estimateForMachine(machine: MachineRow, context: EstimateContext): MachineEstimateResult {
  const inputs = new Inputs();
  let machineClass: MachineClass;
  try {
    machineClass = machineClassOrThrow(machine.classId);
  } catch {
    return { available: false, reason: `The machine class "${machine.classId}" has no published coefficients.`, inputs: inputs.list };
  }
  inputs.add('machineClass', machineClass.id, 'machine');
  const listPrice = machine.listPrice ?? machine.purchasePrice;
  const purchasePrice = machine.purchasePrice ?? machine.listPrice;
  if (listPrice === null || purchasePrice === null || new Dec(listPrice).lte(0)) {
    return { available: false, reason: 'Record the list or purchase price to estimate what the machine costs.', inputs: inputs.list };
  }
  inputs.add('listPrice', listPrice, 'machine');
  inputs.add('purchasePrice', purchasePrice, 'machine');
  const engineNeeded = hasEngine(machineClass);
  const needsHp = engineNeeded || Array.isArray(machineClass.remainingValue);
  if (needsHp && machine.ptoHp === null) {
    return { available: false, reason: 'Record the PTO horsepower to estimate a power unit’s cost.', inputs: inputs.list };
  }
  if (machine.ptoHp !== null && needsHp) inputs.add('ptoHp', machine.ptoHp, 'machine');

  const years = yearsOwned(machine, machineClass, inputs);
  const perYearHours = hoursPerYear(machine, machineClass, years, context, inputs);
  const rf1 = machine.repairFactor1 ?? machineClass.rf1;
  const rf2 = machine.repairFactor2 ?? machineClass.rf2;
  inputs.add('repairFactor1', rf1, machine.repairFactor1 ? 'machine' : 'class-default');
  inputs.add('repairFactor2', rf2, machine.repairFactor2 ? 'machine' : 'class-default');
  const fuelType: FuelType = machine.fuelType ?? 'diesel';
  const engine = engineNeeded
    ? { ptoHp: machine.ptoHp!, fuelType: inputs.add('fuelType', fuelType, machine.fuelType ? 'machine' : 'class-default') as FuelType, fuelPricePerGallon: fuelPrice(context, inputs) }
    : null;
  // The operator's time is costed once, on the power unit that carries them, as A3-29 does.
  const wage =
    engineNeeded && context.familySheet
      ? inputs.add('laborWagePerHour', context.familySheet.operatorWage, 'rate-sheet')
      : inputs.add('laborWagePerHour', '0', 'method-default');
  const laborFactor = context.familySheet ? inputs.add('laborFactor', context.familySheet.laborFactor, 'rate-sheet') : inputs.add('laborFactor', DEFAULT_LABOR_FACTOR, 'method-default');

  const costInputs: MachineCostInputs = {
    repairFactors: { rf1, rf2 },
    remainingValue: remainingValueCoefficientsOrThrow(machineClass, machine.ptoHp),
    listPrice,
    purchasePrice,
    yearsOwned: years,
    hoursPerYear: perYearHours,
    ageAtPurchase: ageAtPurchase(machine, inputs),
    hoursAtPurchase: inputs.add('hoursAtPurchase', machine.hoursAtPurchase, 'machine'),
    interestRatePct: inputs.add('interestRatePct', context.interestRatePct, context.interestFromQuery ? 'query' : 'method-default'),
    tihPct: inputs.add('tihPct', DEFAULT_TIH_PCT, 'method-default'),
    salvageValue: null,
    engine,
    lubePct: engine ? inputs.add('lubePct', DEFAULT_LUBE_PCT, 'method-default') : DEFAULT_LUBE_PCT,
    laborWagePerHour: wage,
    laborFactor,
    method: 'capital-recovery',
  };
  try {
    return { available: true, estimate: estimateMachineCost(costInputs), inputs: inputs.list };
  } catch (err) {
    if (err instanceof ComputationError) return { available: false, reason: err.message, inputs: inputs.list };
    throw err;
  }
}
