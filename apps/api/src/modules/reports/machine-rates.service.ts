import { Inject, Injectable, type StreamableFile } from '@nestjs/common';
import type { Decimal } from 'decimal.js';
import type { Executor } from '@hitchbook/db';
import { actualMachineRates, costSumsAsEntries, yearBounds, type CostSums } from '@hitchbook/db/square-up-sums';
import { actualMachineRateOrThrow, compareWithEstimate, COST_CATEGORIES, type ActualRate, type CategoryAmounts } from '@hitchbook/shared/actual-rate';
import { breakEvenAcresOrThrow } from '@hitchbook/shared/break-even';
import { Dec, fixed } from '@hitchbook/shared/decimal';
import { ComputationError } from '@hitchbook/shared/errors';
import { machineClassOrThrow, MACHINE_CLASS_IDS, type MachineClassId } from '@hitchbook/shared/machine-classes';
import { COST_BREAKDOWN_KEYS, type CostBreakdown } from '@hitchbook/shared/machine-cost';
import { roundToCent, toMoneyString } from '@hitchbook/shared/money';
import {
  ABOVE_ESTIMATE_FLAG_PCT,
  DEFAULT_INTEREST_RATE_PCT,
  DEFAULT_MARGIN_PCT,
  type BreakEvenDto,
  type CategoryAmountsDto,
  type CustomRateDto,
  type EstimateBreakdownDto,
  type MachineHoursHistoryDto,
  type MachineRateRowDto,
  type MachineRatesReportDto,
} from '@hitchbook/shared/schemas/reports';
import { DB, type DbHandle } from '../../core/database.js';
import { estimateForMachine, type MachineEstimateResult } from './machine-estimate.js';
import { MachineYearRepository, type MachineRow } from './machine-year.repository.js';
import { machineRatesCsv, machineRatesPdf } from './report-exports.js';

export interface MachineRatesAssumptions {
  year: number;
  interestRatePct?: Decimal;
  marginPct?: Decimal;
}

export const MACHINE_RATE_RULES = [
  'Hours and acres: approved, invoiced and squared work entries of the year; an entry’s hours count for its power unit and its implement.',
  'Actual costs: the year’s logged costs by category; an improvement counts an equal share in each year of its life. They hold no depreciation of the machine itself.',
  'Estimate: the ASABE D497/EP496 method as Iowa State AgDM A3-29 lays it out, fed with the machine’s own record, the year’s fuel tickets and the family rate sheet; class and method defaults fill the gaps and are listed.',
  'Custom rate: what issued invoices charged for the machine’s work per acre and per hour; without invoiced work, the neighbour sheet’s per-acre custom rates for the work types it did.',
  'Break-even acres: the estimate’s yearly ownership cost ÷ (custom rate per acre − own operating cost per acre, with the operator’s wage).',
  `Flags: logged repairs, fuel and lube, and taxes-insurance-housing more than ${ABOVE_ESTIMATE_FLAG_PCT} % above the estimate for the same items per hour; acres below break-even.`,
  'Suggested machine-hour rate for next year: the higher of the actual cost per hour and the estimate per hour without labour, plus the margin, to the cent.',
];

function amountsDto(amounts: CategoryAmounts): CategoryAmountsDto {
  const out = {} as CategoryAmountsDto;
  for (const key of [...COST_CATEGORIES, 'total'] as const) out[key] = toMoneyString(amounts[key]);
  return out;
}

function breakdownDto(breakdown: CostBreakdown): EstimateBreakdownDto {
  const out = {} as EstimateBreakdownDto;
  for (const key of COST_BREAKDOWN_KEYS) out[key] = toMoneyString(breakdown[key]);
  return out;
}

function ratio(amount: string | Decimal, by: string | Decimal): Decimal | null {
  const divisor = new Dec(by);
  return divisor.gt(0) ? new Dec(amount).div(divisor) : null;
}

const money = (value: Decimal | null) => (value === null ? null : toMoneyString(value));

interface MachineFigures {
  machine: MachineRow;
  hours: string;
  acres: string;
  costs: CostSums[];
}

@Injectable()
export class MachineRatesService {
  constructor(
    @Inject(DB) private readonly dbh: DbHandle,
    @Inject(MachineYearRepository) private readonly repo: MachineYearRepository,
  ) {}

  private async figures(operationId: string, year: number, executor: Executor): Promise<MachineFigures[]> {
    const [machines, uses, costs] = await Promise.all([
      this.repo.machines(operationId, executor),
      this.repo.useSums(operationId, year, executor),
      this.repo.costSums(operationId, year, executor),
    ]);
    const useBy = new Map(uses.map((use) => [use.machineId, use]));
    const costsBy = new Map<string, CostSums[]>();
    for (const cost of costs) costsBy.set(cost.machineId, [...(costsBy.get(cost.machineId) ?? []), cost]);
    return machines.map((machine) => ({
      machine,
      hours: useBy.get(machine.id)?.hours ?? '0',
      acres: useBy.get(machine.id)?.acres ?? '0',
      costs: costsBy.get(machine.id) ?? [],
    }));
  }

  /** Each machine's actual costs of the year by the engine's actual-rate method (per hour null without hours). */
  actualRates(operationId: string, year: number, executor: Executor = this.dbh.db): Promise<Map<string, ActualRate>> {
    return actualMachineRates(executor, operationId, year);
  }

  async history(operationId: string): Promise<MachineHoursHistoryDto> {
    const [rows, machines] = await Promise.all([this.repo.hoursByYear(operationId), this.repo.machines(operationId)]);
    const years = [...new Set(rows.map((row) => row.year))].sort((a, b) => a - b);
    const worked = machines.filter((machine) => rows.some((row) => row.machineId === machine.id));
    return {
      years,
      machines: worked.map((machine) => ({
        machineId: machine.id,
        name: machine.name,
        hours: years.map((year) => fixed(new Dec(rows.find((row) => row.machineId === machine.id && row.year === year)?.hours ?? 0), 2)),
      })),
    };
  }

  async report(operationId: string, assumptions: MachineRatesAssumptions, executor: Executor = this.dbh.db): Promise<MachineRatesReportDto> {
    const { year } = assumptions;
    const bounds = yearBounds(year);
    const interestRatePct = assumptions.interestRatePct ? assumptions.interestRatePct.toString() : DEFAULT_INTEREST_RATE_PCT;
    const marginPct = assumptions.marginPct ? assumptions.marginPct.toString() : DEFAULT_MARGIN_PCT;
    const [rows, fuel, sheet, invoiced, sheetRates] = await Promise.all([
      this.figures(operationId, year, executor),
      this.repo.fuelPrices(operationId, year, executor),
      this.repo.familySheetOn(operationId, bounds.to, executor),
      this.repo.invoicedWork(operationId, bounds, executor),
      this.repo.sheetAcreRates(operationId, year, executor),
    ]);
    const currentRates = sheet ? await this.repo.machineRatesOf(operationId, sheet.id, executor) : new Map<string, string>();
    const fuelPrices = new Map(fuel.map((row) => [row.machineId, fixed(new Dec(row.amount).div(row.gallons), 3)]));
    const fuelPrice = (machineId: string | null) => fuelPrices.get(machineId) ?? null;
    const fleetFuelPrice = fuelPrice(null);
    const invoicedBy = new Map(invoiced.map((row) => [row.machineId, row]));
    const sheetRatesBy = new Map(sheetRates.map((row) => [row.machineId, row]));

    const machines: MachineRateRowDto[] = [];
    for (const row of rows) {
      const { machine } = row;
      const worked = new Dec(row.hours).gt(0) || row.costs.length > 0;
      if (!worked && machine.status !== 'active') continue;
      if (!(MACHINE_CLASS_IDS as readonly string[]).includes(machine.classId)) continue;
      const actual = actualMachineRateOrThrow({ year, hours: row.hours, acres: new Dec(row.acres).gt(0) ? row.acres : null, entries: costSumsAsEntries(row.costs) });
      const estimate = estimateForMachine(machine, {
        year,
        yearHours: row.hours,
        machineFuelPrice: fuelPrice(machine.id),
        fleetFuelPrice,
        interestRatePct,
        interestFromQuery: assumptions.interestRatePct !== undefined,
        familySheet: sheet,
      });
      const comparison = actual.perHour && estimate.available ? compareWithEstimate(actual.perHour, estimate.estimate.perHour) : null;
      const customRate = this.customRate(invoicedBy.get(machine.id), sheetRatesBy.get(machine.id));
      const breakEven = this.breakEven(row, actual.perYear, estimate, customRate);
      const classId = machine.classId as MachineClassId;
      machines.push({
        machineId: machine.id,
        name: machine.name,
        classId,
        classLabel: machineClassOrThrow(classId).label,
        kind: machine.kind,
        status: machine.status,
        hours: fixed(new Dec(row.hours), 2),
        acres: fixed(new Dec(row.acres), 2),
        costs: amountsDto(actual.perYear),
        perHour: actual.perHour ? amountsDto(actual.perHour) : null,
        perAcre: actual.perAcre ? amountsDto(actual.perAcre) : null,
        estimate: estimate.available
          ? {
              available: true,
              perYear: breakdownDto(estimate.estimate.perYear),
              perHour: breakdownDto(estimate.estimate.perHour),
              salvageValue: toMoneyString(estimate.estimate.salvageValue),
              remainingValuePct: fixed(estimate.estimate.remainingValuePct, 2),
              inputs: estimate.inputs,
            }
          : { available: false, reason: estimate.reason, inputs: estimate.inputs },
        comparison: comparison?.map((c) => ({
          item: c.item,
          actualPerHour: toMoneyString(c.actual),
          estimatePerHour: toMoneyString(c.estimate),
          differencePerHour: toMoneyString(c.difference),
        })) ?? null,
        customRate,
        breakEven,
        flags: this.flags(row, comparison, breakEven),
        currentRate: sheet && currentRates.has(machine.id) ? { perHour: fixed(new Dec(currentRates.get(machine.id)!), 2), rateSheetId: sheet.id } : null,
        suggestedRate: this.suggestion(actual.perHour, estimate, marginPct),
      });
    }
    return {
      year,
      interestRatePct,
      marginPct,
      machines,
      charts: {
        costPerHourByCategory: machines
          .filter((m) => m.perHour !== null)
          .map((m) => ({ machineId: m.machineId, name: m.name, ...m.perHour! })),
      },
      rules: MACHINE_RATE_RULES,
    };
  }

  async reportCsv(operationId: string, assumptions: MachineRatesAssumptions): Promise<StreamableFile> {
    return machineRatesCsv(await this.report(operationId, assumptions));
  }

  async reportPdf(operationId: string, operationName: string, assumptions: MachineRatesAssumptions): Promise<StreamableFile> {
    return machineRatesPdf(await this.report(operationId, assumptions), operationName);
  }

  private customRate(billed: { revenue: string; acres: string; hours: string } | undefined, sheet: { amount: string; acres: string } | undefined): CustomRateDto {
    if (billed) {
      return { source: 'invoices', perAcre: money(ratio(billed.revenue, billed.acres)), perHour: money(ratio(billed.revenue, billed.hours)), revenue: toMoneyString(billed.revenue) };
    }
    const perAcre = sheet ? ratio(sheet.amount, sheet.acres) : null;
    return perAcre ? { source: 'rate-sheet', perAcre: toMoneyString(perAcre), perHour: null, revenue: null } : { source: null, perAcre: null, perHour: null, revenue: null };
  }

  private breakEven(row: MachineFigures, perYear: CategoryAmounts, estimate: MachineEstimateResult, customRate: CustomRateDto): BreakEvenDto {
    const none = (reason: string): BreakEvenDto => ({ acres: null, annualFixedCost: null, customRatePerAcre: customRate.perAcre, variableCostPerAcre: null, reason });
    if (!estimate.available) return none('No estimate of the yearly ownership cost: ' + estimate.reason);
    if (customRate.perAcre === null) return none('No custom rate per acre for the work this machine did.');
    const acres = new Dec(row.acres);
    if (acres.lte(0)) return none('No acres logged this year to put the operating cost per acre.');
    const annualFixedCost = estimate.estimate.perYear.ownership;
    const operating = perYear.fuel.plus(perYear.repair).plus(perYear.parts).plus(perYear.tires).plus(estimate.estimate.perHour.labor.times(row.hours));
    const variableCostPerAcre = operating.div(acres);
    const figures = { annualFixedCost: toMoneyString(annualFixedCost), customRatePerAcre: customRate.perAcre, variableCostPerAcre: toMoneyString(variableCostPerAcre) };
    try {
      const breakEvenAcres = breakEvenAcresOrThrow({ annualFixedCost, customRatePerAcre: customRate.perAcre, variableCostPerAcre });
      return { acres: fixed(breakEvenAcres, 2), ...figures, reason: null };
    } catch (err) {
      if (err instanceof ComputationError) return { acres: null, ...figures, reason: err.message };
      throw err;
    }
  }

  private flags(row: MachineFigures, comparison: ReturnType<typeof compareWithEstimate> | null, breakEven: BreakEvenDto): MachineRateRowDto['flags'] {
    const flags: MachineRateRowDto['flags'] = [];
    if (comparison) {
      const actual = comparison.reduce((sum, c) => sum.plus(c.actual), new Dec(0));
      const estimate = comparison.reduce((sum, c) => sum.plus(c.estimate), new Dec(0));
      const limit = estimate.times(new Dec(100).plus(ABOVE_ESTIMATE_FLAG_PCT)).div(100);
      if (estimate.gt(0) && actual.gt(limit)) {
        const above = actual.div(estimate).minus(1).times(100);
        flags.push({
          code: 'actual-above-estimate',
          message: `Repairs, fuel and TIH ran ${toMoneyString(actual)}/h against an estimate of ${toMoneyString(estimate)}/h (${fixed(above, 0)} % above).`,
        });
      }
    }
    if (breakEven.acres !== null && new Dec(row.acres).lt(breakEven.acres)) {
      flags.push({ code: 'below-break-even', message: `${fixed(new Dec(row.acres), 0)} acres this year, below the ${fixed(new Dec(breakEven.acres), 0)} acres where owning beats hiring.` });
    }
    return flags;
  }

  private suggestion(actualPerHour: CategoryAmounts | null, estimate: MachineEstimateResult, marginPct: string): MachineRateRowDto['suggestedRate'] {
    const candidates: Array<{ basis: 'actual' | 'estimate'; perHour: Decimal }> = [];
    if (actualPerHour) candidates.push({ basis: 'actual', perHour: actualPerHour.total });
    if (estimate.available) candidates.push({ basis: 'estimate', perHour: estimate.estimate.perHour.total.minus(estimate.estimate.perHour.labor) });
    const best = candidates.sort((a, b) => b.perHour.comparedTo(a.perHour))[0];
    if (!best || best.perHour.lte(0)) return null;
    const perHour = roundToCent(best.perHour.times(new Dec(100).plus(marginPct)).div(100));
    return { perHour: toMoneyString(perHour), basis: best.basis, marginPct };
  }
}
