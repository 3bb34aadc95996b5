import { Inject, Injectable } from '@nestjs/common';
import { and, asc, count, desc, eq, gt, inArray, lte } from 'drizzle-orm';
import { meterReadings, type Executor, type MeterReading } from '@hitchbook/db';
import { DB, type DbHandle } from '../../core/database.js';

export type NewMeterReading = Omit<typeof meterReadings.$inferInsert, 'operationId' | 'machineId' | 'id'>;

/** Every query is scoped by the operation id passed first. Ties on the time go by entry order. */
@Injectable()
export class MeterReadingsRepository {
  constructor(@Inject(DB) private readonly dbh: DbHandle) {}

  private of(operationId: string, machineId: string) {
    return and(eq(meterReadings.operationId, operationId), eq(meterReadings.machineId, machineId));
  }

  async page(operationId: string, machineId: string, limit: number, offset: number): Promise<{ rows: MeterReading[]; total: number }> {
    const where = this.of(operationId, machineId);
    const [rows, totals] = await Promise.all([
      this.dbh.db.select().from(meterReadings).where(where).orderBy(desc(meterReadings.readAt), desc(meterReadings.createdAt)).limit(limit).offset(offset),
      this.dbh.db.select({ n: count() }).from(meterReadings).where(where),
    ]);
    return { rows, total: totals[0]?.n ?? 0 };
  }

  /** The latest readings in time order, for the machine page's chart. */
  async recent(operationId: string, machineId: string, limit: number): Promise<MeterReading[]> {
    const rows = await this.dbh.db
      .select()
      .from(meterReadings)
      .where(this.of(operationId, machineId))
      .orderBy(desc(meterReadings.readAt), desc(meterReadings.createdAt))
      .limit(limit);
    return rows.reverse();
  }

  /** The newest reading of each machine, in one query for a whole page of machines (same order as `page`). */
  async latestOfMachines(operationId: string, machineIds: string[]): Promise<Map<string, MeterReading>> {
    if (machineIds.length === 0) return new Map();
    const rows = await this.dbh.db
      .selectDistinctOn([meterReadings.machineId])
      .from(meterReadings)
      .where(and(eq(meterReadings.operationId, operationId), inArray(meterReadings.machineId, machineIds)))
      .orderBy(meterReadings.machineId, desc(meterReadings.readAt), desc(meterReadings.createdAt));
    return new Map(rows.map((r) => [r.machineId, r]));
  }

  /** The last reading at or before a moment: where a cab app takes the next entry's meter start from. */
  async latestAtOrBefore(operationId: string, machineId: string, at: Date, executor: Executor = this.dbh.db): Promise<MeterReading | undefined> {
    const [row] = await executor
      .select()
      .from(meterReadings)
      .where(and(this.of(operationId, machineId), lte(meterReadings.readAt, at)))
      .orderBy(desc(meterReadings.readAt), desc(meterReadings.createdAt))
      .limit(1);
    return row;
  }

  async firstAfter(operationId: string, machineId: string, at: Date, executor: Executor = this.dbh.db): Promise<MeterReading | undefined> {
    const [row] = await executor
      .select()
      .from(meterReadings)
      .where(and(this.of(operationId, machineId), gt(meterReadings.readAt, at)))
      .orderBy(asc(meterReadings.readAt), asc(meterReadings.createdAt))
      .limit(1);
    return row;
  }

  async insert(operationId: string, machineId: string, values: NewMeterReading, executor: Executor = this.dbh.db): Promise<MeterReading> {
    const [row] = await executor.insert(meterReadings).values({ ...values, operationId, machineId }).returning();
    return row!;
  }
}
