import { Inject, Injectable } from '@nestjs/common';
import type { Decimal } from 'decimal.js';
import { and, asc, desc, eq, gte, lt, ne, or, sql, sum } from 'drizzle-orm';
import { meterReadings, workEntries, type Executor, type MeterReading } from '@hitchbook/db';
import { Dec } from '@hitchbook/shared/decimal';
import { DB, type DbHandle } from '../../core/database.js';

export interface MachineHours {
  /** The larger of the two measures: the meter also counts chores nobody logged, entries cover stretches no reading spans. */
  hours: Decimal;
  source: 'meter' | 'entries';
  /** Total meter hours (offset + meter, so a replaced meter is bridged) at the end less at the start; null without two readings. */
  meterHours: Decimal | null;
  /** Hours of the period's work entries past draft with the machine as power unit or implement. */
  entryHours: Decimal;
}

/** Periods are whole days, `from` and `to` inclusive (YYYY-MM-DD); a reading's day is its UTC date. */
const startOf = (day: string) => new Date(`${day}T00:00:00Z`);
const endOf = (day: string) => new Date(startOf(day).getTime() + 24 * 60 * 60 * 1000);
const totalOf = (r: MeterReading) => new Dec(r.offsetHours).plus(r.hours);

/**
 * How much a machine worked, from its meter readings and its work entries. Every query is scoped by
 * the operation id passed first.
 */
@Injectable()
export class MachineUsageRepository {
  constructor(@Inject(DB) private readonly dbh: DbHandle) {}

  /** Machine hours in a period, for the machine page, year-end rates and use-based square-ups. */
  async hoursInPeriod(operationId: string, machineId: string, from: string, to: string, executor: Executor = this.dbh.db): Promise<MachineHours> {
    const [meterHours, entryHours] = await Promise.all([this.meterHours(operationId, machineId, from, to, executor), this.entryTotal(operationId, machineId, from, to, 'hours', executor)]);
    const meterWins = meterHours !== null && meterHours.gte(entryHours);
    return { hours: meterWins ? meterHours : entryHours, source: meterWins ? 'meter' : 'entries', meterHours, entryHours };
  }

  /** Acres worked in a period by entries past draft with the machine as power unit or implement. */
  async acresInPeriod(operationId: string, machineId: string, from: string, to: string, executor: Executor = this.dbh.db): Promise<Decimal> {
    return this.entryTotal(operationId, machineId, from, to, 'acres', executor);
  }

  // The baseline is the last reading before the period, else the period's first reading.
  private async meterHours(operationId: string, machineId: string, from: string, to: string, executor: Executor): Promise<Decimal | null> {
    const ofMachine = and(eq(meterReadings.operationId, operationId), eq(meterReadings.machineId, machineId));
    const [end] = await executor
      .select()
      .from(meterReadings)
      .where(and(ofMachine, lt(meterReadings.readAt, endOf(to))))
      .orderBy(desc(meterReadings.readAt), desc(meterReadings.createdAt))
      .limit(1);
    const [before] = await executor
      .select()
      .from(meterReadings)
      .where(and(ofMachine, lt(meterReadings.readAt, startOf(from))))
      .orderBy(desc(meterReadings.readAt), desc(meterReadings.createdAt))
      .limit(1);
    const [first] = before
      ? [before]
      : await executor
          .select()
          .from(meterReadings)
          .where(and(ofMachine, gte(meterReadings.readAt, startOf(from)), lt(meterReadings.readAt, endOf(to))))
          .orderBy(asc(meterReadings.readAt), asc(meterReadings.createdAt))
          .limit(1);
    if (!end || !first || end.id === first.id) return null;
    return totalOf(end).minus(totalOf(first));
  }

  private async entryTotal(operationId: string, machineId: string, from: string, to: string, column: 'hours' | 'acres', executor: Executor): Promise<Decimal> {
    const [row] = await executor
      .select({ total: sum(workEntries[column]) })
      .from(workEntries)
      .where(
        and(
          eq(workEntries.operationId, operationId),
          ne(workEntries.state, 'draft'),
          or(eq(workEntries.powerMachineId, machineId), eq(workEntries.implementMachineId, machineId)),
          sql`${workEntries.workDate} between ${from} and ${to}`,
        ),
      );
    return new Dec(row?.total ?? 0);
  }
}
