import { Inject, Injectable } from '@nestjs/common';
import { and, asc, count, desc, eq, ilike, or, sql, type SQL } from 'drizzle-orm';
import { costEntries, machines, machineShares, meterReadings, workEntries, type Executor, type Machine, type NewMachine } from '@hitchbook/db';
import type { MachineListQuery } from '@hitchbook/shared/schemas/machines';
import { DB, type DbHandle } from '../../core/database.js';

/** An ILIKE pattern matching the text anywhere, with the caller's % and _ taken literally. */
const containsPattern = (text: string) => `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

const SORTS: Record<MachineListQuery['sort'], SQL> = {
  name: asc(machines.name),
  '-name': desc(machines.name),
  year: asc(machines.year),
  '-year': desc(machines.year),
  classId: asc(machines.classId),
  '-classId': desc(machines.classId),
  status: asc(machines.status),
  '-status': desc(machines.status),
  createdAt: asc(machines.createdAt),
  '-createdAt': desc(machines.createdAt),
};

export type MachineValues = Omit<NewMachine, 'operationId' | 'id'>;

/** Every query is scoped by the operation id passed first. */
@Injectable()
export class MachinesRepository {
  constructor(@Inject(DB) private readonly dbh: DbHandle) {}

  async list(operationId: string, filter: MachineListQuery, today: string): Promise<{ rows: Machine[]; total: number }> {
    const where = and(
      eq(machines.operationId, operationId),
      filter.status ? eq(machines.status, filter.status) : undefined,
      filter.kind ? eq(machines.kind, filter.kind) : undefined,
      filter.classId ? eq(machines.classId, filter.classId) : undefined,
      filter.ownerPartyId ? this.ownedOn(filter.ownerPartyId, today) : undefined,
      filter.q
        ? or(
            ...[machines.name, machines.make, machines.model, machines.serialNumber, machines.unitNumber].map((column) => ilike(column, containsPattern(filter.q!))),
          )
        : undefined,
    );
    const [rows, totals] = await Promise.all([
      this.dbh.db
        .select()
        .from(machines)
        .where(where)
        .orderBy(SORTS[filter.sort], asc(machines.name), asc(machines.id))
        .limit(filter.pageSize)
        .offset((filter.page - 1) * filter.pageSize),
      this.dbh.db.select({ n: count() }).from(machines).where(where),
    ]);
    return { rows, total: totals[0]?.n ?? 0 };
  }

  /** The household holds a share in the set in force on the day. */
  private ownedOn(partyId: string, day: string): SQL {
    return sql`exists (
      select 1 from ${machineShares} s
      where s.operation_id = ${machines.operationId} and s.machine_id = ${machines.id} and s.party_id = ${partyId}
        and s.effective_from = (
          select max(s2.effective_from) from ${machineShares} s2
          where s2.operation_id = ${machines.operationId} and s2.machine_id = ${machines.id} and s2.effective_from <= ${day}))`;
  }

  async find(operationId: string, id: string, executor: Executor = this.dbh.db): Promise<Machine | undefined> {
    const [row] = await executor.select().from(machines).where(and(eq(machines.operationId, operationId), eq(machines.id, id)));
    return row;
  }

  /**
   * Locks the machine row for the rest of the transaction: share sets and meter readings of one
   * machine are checked against what is stored, so two writers must take turns.
   */
  async lock(operationId: string, id: string, tx: Executor): Promise<Machine | undefined> {
    const [row] = await tx.select().from(machines).where(and(eq(machines.operationId, operationId), eq(machines.id, id))).for('update');
    return row;
  }

  async insert(operationId: string, values: MachineValues, executor: Executor = this.dbh.db): Promise<Machine> {
    const [row] = await executor.insert(machines).values({ ...values, operationId }).returning();
    return row!;
  }

  async update(operationId: string, id: string, values: Partial<MachineValues>, executor: Executor = this.dbh.db): Promise<Machine | undefined> {
    const [row] = await executor.update(machines).set(values).where(and(eq(machines.operationId, operationId), eq(machines.id, id))).returning();
    return row;
  }

  /** Meter readings, costs or work logged against the machine: then it is sold or retired, never deleted. */
  async hasHistory(operationId: string, id: string, executor: Executor = this.dbh.db): Promise<boolean> {
    const [row] = await executor.execute<{ has: boolean }>(sql`select
      exists (select 1 from ${meterReadings} where operation_id = ${operationId} and machine_id = ${id})
      or exists (select 1 from ${costEntries} where operation_id = ${operationId} and machine_id = ${id})
      or exists (select 1 from ${workEntries} where operation_id = ${operationId} and (power_machine_id = ${id} or implement_machine_id = ${id}))
      as has`).then((r) => r.rows);
    return row?.has ?? false;
  }

  async delete(operationId: string, id: string, executor: Executor = this.dbh.db): Promise<void> {
    await executor.delete(machines).where(and(eq(machines.operationId, operationId), eq(machines.id, id)));
  }
}
