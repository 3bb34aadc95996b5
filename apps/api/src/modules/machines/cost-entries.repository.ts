import { Inject, Injectable } from '@nestjs/common';
import { and, asc, count, desc, eq, gte, lte, or, sql, type SQL } from 'drizzle-orm';
import { costEntries, parties, type CostEntry, type Executor, type NewCostEntry } from '@hitchbook/db';
import type { CostEntryListQuery } from '@hitchbook/shared/schemas/machines';
import { DB, type DbHandle } from '../../core/database.js';

const SORTS: Record<CostEntryListQuery['sort'], SQL> = {
  incurredOn: asc(costEntries.incurredOn),
  '-incurredOn': desc(costEntries.incurredOn),
  amount: asc(costEntries.amount),
  '-amount': desc(costEntries.amount),
  category: asc(costEntries.category),
  '-category': desc(costEntries.category),
};

export type CostEntryRow = CostEntry & { paidByName: string | null };
export type CostEntryValues = Omit<NewCostEntry, 'operationId' | 'id' | 'machineId'>;

/** Every query is scoped by the operation id passed first. */
@Injectable()
export class CostEntriesRepository {
  constructor(@Inject(DB) private readonly dbh: DbHandle) {}

  private ofMachine(operationId: string, machineId: string) {
    return and(eq(costEntries.operationId, operationId), eq(costEntries.machineId, machineId));
  }

  private withPayer(executor: Executor) {
    return executor
      .select({ entry: costEntries, paidByName: parties.name })
      .from(costEntries)
      .leftJoin(parties, and(eq(parties.operationId, costEntries.operationId), eq(parties.id, costEntries.paidByPartyId)));
  }

  async list(operationId: string, machineId: string, filter: CostEntryListQuery): Promise<{ rows: CostEntryRow[]; total: number; amount: string; gallons: string }> {
    const where = and(
      this.ofMachine(operationId, machineId),
      filter.category ? eq(costEntries.category, filter.category) : undefined,
      filter.from ? gte(costEntries.incurredOn, filter.from) : undefined,
      filter.to ? lte(costEntries.incurredOn, filter.to) : undefined,
      filter.paidByPartyId ? eq(costEntries.paidByPartyId, filter.paidByPartyId) : undefined,
    );
    const [rows, totals] = await Promise.all([
      this.withPayer(this.dbh.db)
        .where(where)
        .orderBy(SORTS[filter.sort], desc(costEntries.createdAt), asc(costEntries.id))
        .limit(filter.pageSize)
        .offset((filter.page - 1) * filter.pageSize),
      this.dbh.db
        .select({ n: count(), amount: sql<string>`coalesce(sum(${costEntries.amount}), 0)::text`, gallons: sql<string>`coalesce(sum(${costEntries.gallons}), 0)::text` })
        .from(costEntries)
        .where(where),
    ]);
    const t = totals[0];
    return { rows: rows.map((r) => ({ ...r.entry, paidByName: r.paidByName })), total: t?.n ?? 0, amount: t?.amount ?? '0', gallons: t?.gallons ?? '0' };
  }

  async find(operationId: string, machineId: string, id: string, executor: Executor = this.dbh.db): Promise<CostEntryRow | undefined> {
    const [row] = await this.withPayer(executor).where(and(this.ofMachine(operationId, machineId), eq(costEntries.id, id)));
    return row && { ...row.entry, paidByName: row.paidByName };
  }

  async insert(operationId: string, machineId: string, values: CostEntryValues, executor: Executor = this.dbh.db): Promise<CostEntry> {
    const [row] = await executor.insert(costEntries).values({ ...values, operationId, machineId }).returning();
    return row!;
  }

  async update(operationId: string, machineId: string, id: string, values: Partial<CostEntryValues>, executor: Executor = this.dbh.db): Promise<void> {
    await executor.update(costEntries).set(values).where(and(this.ofMachine(operationId, machineId), eq(costEntries.id, id)));
  }

  async delete(operationId: string, machineId: string, id: string, executor: Executor = this.dbh.db): Promise<void> {
    await executor.delete(costEntries).where(and(this.ofMachine(operationId, machineId), eq(costEntries.id, id)));
  }

  /**
   * The costs that bear on a year's actual rate: the year's own, plus earlier improvements, which are
   * written off over several years.
   */
  async bearingOnYear(operationId: string, machineId: string, year: number): Promise<CostEntry[]> {
    return this.dbh.db
      .select()
      .from(costEntries)
      .where(
        and(
          this.ofMachine(operationId, machineId),
          lte(costEntries.incurredOn, `${year}-12-31`),
          or(gte(costEntries.incurredOn, `${year}-01-01`), eq(costEntries.category, 'improvement')),
        ),
      );
  }
}
