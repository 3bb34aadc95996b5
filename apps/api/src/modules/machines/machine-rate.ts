import type { Decimal } from 'decimal.js';
import type { Machine } from '@hitchbook/db';
import { Dec } from '@hitchbook/shared/decimal';
import { hasEngine, machineClassOrThrow, remainingValueCoefficientsOrThrow } from '@hitchbook/shared/machine-classes';
import type { MachineCostInputs } from '@hitchbook/shared/machine-cost';
import type { RateInputDto } from '@hitchbook/shared/schemas/machines';

// Planning defaults for the published-method estimate when the machine carries no figure of its own.
// Real interest 5 %: Iowa State AgDM A3-29 (older edition), nominal 8 % less 3 % inflation.
const DEFAULT_INTEREST_RATE_PCT = '5';
// Taxes, insurance and housing at 1 % of average value, and lubrication at 15 % of fuel: A3-29.
const DEFAULT_TIH_PCT = '1';
const DEFAULT_LUBE_PCT = '15';
// Labour hours per machine hour (A3-29's 1.1); the machine rate leaves the operator's wage out.
const DEFAULT_LABOR_FACTOR = '1.1';
// Economic life: 15 years for tractors, 10-12 for most other machines (A3-29); the upper figure is used.
const DEFAULT_YEARS_POWER = 15;
const DEFAULT_YEARS_OTHER = 12;
// A planning fuel price for machines with no fuel tickets that year: an invented round figure, no source.
const DEFAULT_FUEL_PRICE_PER_GALLON = '3.50';

export interface RateContext {
  /** Hours the machine worked in the year, used for hours per year when no planning figure is set. */
  yearHours: Decimal;
  /** Average price per gallon on the year's fuel tickets for this machine, if any carried gallons. */
  yearFuelPricePerGallon: Decimal | null;
  /** Caller's planning assumptions; they win over everything else. */
  interestRatePct?: Decimal;
  fuelPricePerGallon?: Decimal;
}

export type RateInputs = { available: true; inputs: MachineCostInputs; used: RateInputDto[] } | { available: false; reason: string };

/**
 * The published-method inputs for one machine: its own numbers first, then the year's records, then
 * the class defaults and the method's planning defaults. Every value used is reported with its source.
 */
export function machineRateInputs(machine: Machine, context: RateContext): RateInputs {
  const machineClass = machineClassOrThrow(machine.classId);
  const list = machine.listPrice ?? machine.purchasePrice;
  const purchase = machine.purchasePrice ?? machine.listPrice;
  if (list === null || purchase === null || new Dec(list).lte(0)) {
    return { available: false, reason: 'Enter the list or purchase price to estimate this machine’s rate.' };
  }
  if (machineClass.kind === 'power' && machine.ptoHp === null) {
    return { available: false, reason: 'Enter the PTO horsepower to estimate this tractor’s rate.' };
  }
  const used: RateInputDto[] = [];
  const use = <T extends { toString(): string }>(name: string, value: T, source: RateInputDto['source']): T => {
    used.push({ name, value: value.toString(), source });
    return value;
  };

  use('listPrice', list, 'machine');
  use('purchasePrice', purchase, 'machine');
  const years =
    machine.plannedYearsOwned !== null
      ? use('yearsOwned', machine.plannedYearsOwned, 'machine')
      : use('yearsOwned', machineClass.kind === 'power' ? DEFAULT_YEARS_POWER : DEFAULT_YEARS_OTHER, 'class-default');
  const hoursPerYear =
    machine.plannedHoursPerYear !== null
      ? use('hoursPerYear', new Dec(machine.plannedHoursPerYear), 'machine')
      : context.yearHours.gt(0)
        ? use('hoursPerYear', context.yearHours, 'year-records')
        : use('hoursPerYear', new Dec(machineClass.lifeHours).div(years).toDecimalPlaces(1), 'class-default');
  const ageAtPurchase =
    machine.year !== null && machine.purchaseDate !== null
      ? use('ageAtPurchase', Math.max(0, Number(machine.purchaseDate.slice(0, 4)) - machine.year), 'machine')
      : use('ageAtPurchase', 0, 'method-default');
  const hoursAtPurchase = use('hoursAtPurchase', new Dec(machine.hoursAtPurchase), 'machine');
  const interestRatePct = context.interestRatePct
    ? use('interestRatePct', context.interestRatePct, 'query')
    : use('interestRatePct', new Dec(DEFAULT_INTEREST_RATE_PCT), 'method-default');
  const rf1 = machine.repairFactor1 !== null ? use('rf1', machine.repairFactor1, 'machine') : use('rf1', machineClass.rf1, 'class-default');
  const rf2 = machine.repairFactor2 !== null ? use('rf2', machine.repairFactor2, 'machine') : use('rf2', machineClass.rf2, 'class-default');

  let engine: MachineCostInputs['engine'] = null;
  if (hasEngine(machineClass) && machine.ptoHp !== null) {
    const fuelPricePerGallon = context.fuelPricePerGallon
      ? use('fuelPricePerGallon', context.fuelPricePerGallon, 'query')
      : context.yearFuelPricePerGallon
        ? use('fuelPricePerGallon', context.yearFuelPricePerGallon.toDecimalPlaces(3), 'year-records')
        : use('fuelPricePerGallon', new Dec(DEFAULT_FUEL_PRICE_PER_GALLON), 'method-default');
    engine = {
      ptoHp: use('ptoHp', machine.ptoHp, 'machine'),
      fuelType: use('fuelType', machine.fuelType ?? 'diesel', machine.fuelType ? 'machine' : 'method-default'),
      fuelPricePerGallon,
    };
  }

  return {
    available: true,
    used,
    inputs: {
      repairFactors: { rf1, rf2 },
      remainingValue: remainingValueCoefficientsOrThrow(machineClass, machine.ptoHp),
      listPrice: list,
      purchasePrice: purchase,
      yearsOwned: years,
      hoursPerYear,
      ageAtPurchase,
      hoursAtPurchase,
      interestRatePct,
      tihPct: use('tihPct', DEFAULT_TIH_PCT, 'method-default'),
      salvageValue: null,
      engine,
      lubePct: use('lubePct', DEFAULT_LUBE_PCT, 'method-default'),
      laborWagePerHour: use('laborWagePerHour', '0', 'method-default'),
      laborFactor: use('laborFactor', DEFAULT_LABOR_FACTOR, 'method-default'),
      method: 'capital-recovery',
    },
  };
}
