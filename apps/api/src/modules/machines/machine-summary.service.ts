import { Inject, Injectable } from '@nestjs/common';
import type { Decimal } from 'decimal.js';
import type { CostEntry, Machine } from '@hitchbook/db';
import { actualMachineRateOrThrow, COST_CATEGORIES, type CategoryAmounts } from '@hitchbook/shared/actual-rate';
import { ESTIMATE_NOTICE } from '@hitchbook/shared/cautions';
import { Dec, fixed } from '@hitchbook/shared/decimal';
import { COST_BREAKDOWN_KEYS, estimateMachineCost, type CostBreakdown } from '@hitchbook/shared/machine-cost';
import { toMoneyString } from '@hitchbook/shared/money';
import type { CategoryAmountsDto, MachineSummaryDto, MachineSummaryQuery } from '@hitchbook/shared/schemas/machines';
import type { Actor } from '../../common/auth/actor.js';
import { todayIso, yearBounds } from './calendar.js';
import { CostEntriesRepository } from './cost-entries.repository.js';
import { MachineAccess } from './machine-access.js';
import { toMachineDto } from './machine-dto.js';
import { machineRateInputs } from './machine-rate.js';
import { MachineUsageRepository, type MachineHours } from './machine-usage.repository.js';
import { MeterReadingsRepository } from './meter-readings.repository.js';
import { toMeterReadingDto } from './meter-readings.service.js';
import { SharesRepository } from './shares.repository.js';

/** Enough points for a chart of many seasons; older readings stay in the readings table. */
const CHART_READINGS = 500;

type EstimatedRate = NonNullable<MachineSummaryDto['estimatedRate']>;
type ActualRateDto = NonNullable<MachineSummaryDto['actualRate']>;

function money<K extends string>(amounts: Record<K, Decimal>, keys: readonly K[]): Record<K, string> {
  const out = {} as Record<K, string>;
  for (const key of keys) out[key] = toMoneyString(amounts[key]);
  return out;
}

const categoryMoney = (amounts: CategoryAmounts): CategoryAmountsDto => money(amounts, [...COST_CATEGORIES, 'total']);
const breakdownMoney = (b: CostBreakdown) => money(b, COST_BREAKDOWN_KEYS);

/** Everything the machine page shows, in one read; money only for the money roles. */
@Injectable()
export class MachineSummaryService {
  constructor(
    @Inject(MachineAccess) private readonly access: MachineAccess,
    @Inject(SharesRepository) private readonly shares: SharesRepository,
    @Inject(MeterReadingsRepository) private readonly readings: MeterReadingsRepository,
    @Inject(MachineUsageRepository) private readonly usage: MachineUsageRepository,
    @Inject(CostEntriesRepository) private readonly costs: CostEntriesRepository,
  ) {}

  async summary(actor: Actor, machineId: string, query: MachineSummaryQuery): Promise<MachineSummaryDto> {
    const machine = await this.access.machineOrThrow(actor, 'machine.read', machineId);
    const year = query.year ?? Number(todayIso().slice(0, 4));
    const { from, to } = yearBounds(year);
    const op = actor.operationId;
    const [owners, readings, hours, acres] = await Promise.all([
      this.shares.inForceOn(op, machineId, todayIso()),
      this.readings.recent(op, machineId, CHART_READINGS),
      this.usage.hoursInPeriod(op, machineId, from, to),
      this.usage.acresInPeriod(op, machineId, from, to),
    ]);
    const withMoney = this.access.seesMoney(actor);
    const summary: MachineSummaryDto = {
      machine: toMachineDto(machine, owners, withMoney),
      year,
      meterHistory: readings.map(toMeterReadingDto),
      usage: {
        hours: hours.hours.toFixed(2),
        source: hours.source,
        meterHours: hours.meterHours?.toFixed(1) ?? null,
        entryHours: hours.entryHours.toFixed(2),
        acres: acres.toFixed(3),
      },
      notice: ESTIMATE_NOTICE,
    };
    if (!withMoney) return summary;

    const bearing = await this.costs.bearingOnYear(op, machineId, year);
    const ofYear = bearing.filter((c) => c.incurredOn >= from);
    const actual = actualMachineRateOrThrow({
      year,
      hours: hours.hours,
      acres: acres.gt(0) ? acres : null,
      entries: bearing.map((c) => ({ category: c.category, amount: c.amount, year: Number(c.incurredOn.slice(0, 4)), lifeYears: c.improvementLifeYears ?? undefined })),
    });
    return {
      ...summary,
      costTotals: { byCategory: categoryMoney(spentByCategory(ofYear)), fuelGallons: sumOf(ofYear, (c) => c.gallons).toFixed(3) },
      estimatedRate: this.estimatedRate(machine, hours, ofYear, query),
      actualRate: actualRateDto(actual),
    };
  }

  /** The published-method estimate from the machine's own numbers, with every input it used. */
  estimatedRate(machine: Machine, hours: MachineHours, yearCosts: readonly CostEntry[], query: Pick<MachineSummaryQuery, 'interestRatePct' | 'fuelPricePerGallon'>): EstimatedRate {
    const tickets = yearCosts.filter((c) => c.category === 'fuel' && c.gallons !== null && new Dec(c.gallons).gt(0));
    const gallons = sumOf(tickets, (c) => c.gallons);
    const prepared = machineRateInputs(machine, {
      yearHours: hours.hours,
      yearFuelPricePerGallon: gallons.gt(0) ? sumOf(tickets, (c) => c.amount).div(gallons) : null,
      interestRatePct: query.interestRatePct,
      fuelPricePerGallon: query.fuelPricePerGallon,
    });
    if (!prepared.available) return prepared;
    const estimate = estimateMachineCost(prepared.inputs);
    return {
      available: true,
      method: 'capital-recovery',
      perHour: breakdownMoney(estimate.perHour),
      perYear: breakdownMoney(estimate.perYear),
      salvageValue: toMoneyString(estimate.salvageValue),
      remainingValuePct: fixed(estimate.remainingValuePct, 2),
      inputs: prepared.used,
    };
  }
}

function sumOf<T>(rows: readonly T[], value: (row: T) => string | null): Decimal {
  return rows.reduce<Decimal>((total, row) => total.plus(value(row) ?? 0), new Dec(0));
}

/** Money paid out in the year, by category (improvements at their full amount, not written off). */
function spentByCategory(rows: readonly CostEntry[]): CategoryAmounts {
  const amounts = { total: sumOf(rows, (c) => c.amount) } as CategoryAmounts;
  for (const category of COST_CATEGORIES) amounts[category] = sumOf(rows.filter((c) => c.category === category), (c) => c.amount);
  return amounts;
}

function actualRateDto(actual: ReturnType<typeof actualMachineRateOrThrow>): ActualRateDto {
  return {
    perYear: categoryMoney(actual.perYear),
    perHour: actual.perHour && categoryMoney(actual.perHour),
    perAcre: actual.perAcre && categoryMoney(actual.perAcre),
  };
}
