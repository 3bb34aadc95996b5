import { Inject, Injectable } from '@nestjs/common';
import { and, asc, eq, gte, inArray, lte, ne, or, sql, type SQL, type SQLWrapper } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { fields, invoiceEntries, machines, meterReadings, parties, users, workEntries, workTypes, type Executor, type NewWorkEntry, type WorkEntry } from '@hitchbook/db';
import type { WorkEntryFilter } from '@hitchbook/shared/schemas/work-entries';
import { DB, type DbHandle } from '../../core/database.js';

const powerMachines = alias(machines, 'power_machines');
const implementMachines = alias(machines, 'implement_machines');

/** An entry with the names the table and the entry page show. */
export type WorkEntryView = WorkEntry & {
  fieldName: string;
  workTypeName: string;
  powerMachineName: string | null;
  implementMachineName: string | null;
  operatorName: string;
  billToName: string;
};

export interface SameDayEntry {
  id: string;
  fieldName: string;
  hours: string;
  operatorHours: string | null;
  acres: string | null;
  startedAt: Date | null;
  endedAt: Date | null;
  meterStart: string | null;
  meterEnd: string | null;
  powerMachineId: string | null;
  implementMachineId: string | null;
}

/** Narrows what a caller may list: an operator sees only their own entries. */
export interface ListScope {
  operatorUserId?: string;
}

export interface ListWindow {
  limit: number;
  offset: number;
}

const STATE_ORDER = sql`case ${workEntries.state} when 'draft' then 1 when 'submitted' then 2 when 'approved' then 3 when 'invoiced' then 4 else 5 end`;

function sortOf(sort: string): SQL[] {
  const descending = sort.startsWith('-');
  const dir = (expr: SQLWrapper) => (descending ? sql`${expr} desc nulls last` : sql`${expr} asc nulls last`);
  switch (sort.replace(/^-/, '')) {
    case 'hours':
      return [dir(workEntries.hours)];
    case 'acres':
      return [dir(workEntries.acres)];
    case 'field':
      return [dir(fields.name)];
    case 'machine':
      return [dir(sql`coalesce(${powerMachines.name}, ${implementMachines.name})`), dir(implementMachines.name)];
    case 'operator':
      return [dir(users.name)];
    case 'state':
      return [dir(STATE_ORDER)];
    default:
      return [dir(workEntries.workDate), dir(workEntries.startedAt), dir(workEntries.createdAt)];
  }
}

/** Every filter is a condition on the entry itself, so the totals need no joins. */
function whereOf(operationId: string, filter: Omit<WorkEntryFilter, 'sort'>, scope: ListScope): SQL {
  return and(
    eq(workEntries.operationId, operationId),
    scope.operatorUserId ? eq(workEntries.operatorUserId, scope.operatorUserId) : undefined,
    filter.dateFrom ? gte(workEntries.workDate, filter.dateFrom) : undefined,
    filter.dateTo ? lte(workEntries.workDate, filter.dateTo) : undefined,
    filter.machineId ? or(eq(workEntries.powerMachineId, filter.machineId), eq(workEntries.implementMachineId, filter.machineId)) : undefined,
    filter.fieldId ? eq(workEntries.fieldId, filter.fieldId) : undefined,
    filter.operatorUserId ? eq(workEntries.operatorUserId, filter.operatorUserId) : undefined,
    filter.billToPartyId ? eq(workEntries.billToPartyId, filter.billToPartyId) : undefined,
    filter.workTypeId ? eq(workEntries.workTypeId, filter.workTypeId) : undefined,
    filter.state ? inArray(workEntries.state, filter.state) : undefined,
  )!;
}

/** Every query is scoped by the operation id passed first. */
@Injectable()
export class WorkEntriesRepository {
  constructor(@Inject(DB) private readonly dbh: DbHandle) {}

  private views(executor: Executor) {
    return executor
      .select({
        entry: workEntries,
        fieldName: fields.name,
        workTypeName: workTypes.name,
        powerMachineName: powerMachines.name,
        implementMachineName: implementMachines.name,
        operatorName: users.name,
        billToName: parties.name,
      })
      .from(workEntries)
      .innerJoin(fields, and(eq(fields.operationId, workEntries.operationId), eq(fields.id, workEntries.fieldId)))
      .innerJoin(workTypes, and(eq(workTypes.operationId, workEntries.operationId), eq(workTypes.id, workEntries.workTypeId)))
      .innerJoin(parties, and(eq(parties.operationId, workEntries.operationId), eq(parties.id, workEntries.billToPartyId)))
      .innerJoin(users, eq(users.id, workEntries.operatorUserId))
      .leftJoin(powerMachines, and(eq(powerMachines.operationId, workEntries.operationId), eq(powerMachines.id, workEntries.powerMachineId)))
      .leftJoin(implementMachines, and(eq(implementMachines.operationId, workEntries.operationId), eq(implementMachines.id, workEntries.implementMachineId)))
      .$dynamic();
  }

  async findView(operationId: string, id: string, executor: Executor = this.dbh.db): Promise<WorkEntryView | undefined> {
    const [row] = await this.views(executor).where(and(eq(workEntries.operationId, operationId), eq(workEntries.id, id)));
    return row ? flatten(row) : undefined;
  }

  async findByClientId(operationId: string, clientId: string, executor: Executor = this.dbh.db): Promise<WorkEntry | undefined> {
    const [row] = await executor.select().from(workEntries).where(and(eq(workEntries.operationId, operationId), eq(workEntries.clientId, clientId)));
    return row;
  }

  /**
   * Locks the entry for the rest of the transaction and tells whether an issued invoice bills it:
   * billing takes the same lock, so an entry cannot be changed and invoiced at once.
   */
  async lockForChange(operationId: string, id: string, tx: Executor): Promise<{ entry: WorkEntry; onInvoice: boolean } | undefined> {
    const [entry] = await tx.select().from(workEntries).where(and(eq(workEntries.operationId, operationId), eq(workEntries.id, id))).for('update');
    if (!entry) return undefined;
    const [billed] = await tx
      .select({ id: invoiceEntries.workEntryId })
      .from(invoiceEntries)
      .where(and(eq(invoiceEntries.operationId, operationId), eq(invoiceEntries.workEntryId, id)));
    return { entry, onInvoice: billed !== undefined };
  }

  async insert(operationId: string, values: Omit<NewWorkEntry, 'operationId' | 'id'>, tx: Executor): Promise<WorkEntry> {
    const [row] = await tx.insert(workEntries).values({ ...values, operationId }).returning();
    return row!;
  }

  /** Inserts imported rows; a row whose import key is already stored is left out, not duplicated. */
  async insertImported(operationId: string, rows: Array<Omit<NewWorkEntry, 'operationId' | 'id'>>, tx: Executor): Promise<Array<{ id: string; importKey: string | null }>> {
    if (rows.length === 0) return [];
    return tx
      .insert(workEntries)
      .values(rows.map((r) => ({ ...r, operationId })))
      .onConflictDoNothing({ target: [workEntries.operationId, workEntries.importKey] })
      .returning({ id: workEntries.id, importKey: workEntries.importKey });
  }

  async existingImportKeys(operationId: string, keys: string[], executor: Executor = this.dbh.db): Promise<Set<string>> {
    if (keys.length === 0) return new Set();
    const rows = await executor
      .select({ key: workEntries.importKey })
      .from(workEntries)
      .where(and(eq(workEntries.operationId, operationId), inArray(workEntries.importKey, keys)));
    return new Set(rows.map((r) => r.key!));
  }

  async update(operationId: string, id: string, values: Partial<Omit<NewWorkEntry, 'operationId' | 'id'>>, tx: Executor): Promise<WorkEntry> {
    const [row] = await tx
      .update(workEntries)
      .set({ ...values, version: sql`${workEntries.version} + 1` })
      .where(and(eq(workEntries.operationId, operationId), eq(workEntries.id, id)))
      .returning();
    return row!;
  }

  async delete(operationId: string, id: string, tx: Executor): Promise<void> {
    await this.deleteMeterReadingOf(operationId, id, tx);
    await tx.delete(workEntries).where(and(eq(workEntries.operationId, operationId), eq(workEntries.id, id)));
  }

  /** An entry's meter end is one reading of its power unit; it goes before the entry changes or goes. */
  async deleteMeterReadingOf(operationId: string, entryId: string, tx: Executor): Promise<void> {
    await tx.delete(meterReadings).where(and(eq(meterReadings.operationId, operationId), eq(meterReadings.workEntryId, entryId)));
  }

  async insertMeterReadings(operationId: string, readings: Array<{ machineId: string; workEntryId: string; readAt: Date; hours: string; offsetHours: string; createdBy: string }>, tx: Executor): Promise<void> {
    if (readings.length === 0) return;
    await tx.insert(meterReadings).values(readings.map((r) => ({ ...r, operationId, kind: 'reading' as const, source: 'import' as const })));
  }

  /** Other entries of that day on any of the machines, for the overlap and gap checks. */
  async sameDay(operationId: string, workDate: string, machineIds: string[], exceptId: string | null, executor: Executor = this.dbh.db): Promise<SameDayEntry[]> {
    if (machineIds.length === 0) return [];
    return executor
      .select({
        id: workEntries.id,
        fieldName: fields.name,
        hours: workEntries.hours,
        operatorHours: workEntries.operatorHours,
        acres: workEntries.acres,
        startedAt: workEntries.startedAt,
        endedAt: workEntries.endedAt,
        meterStart: workEntries.meterStart,
        meterEnd: workEntries.meterEnd,
        powerMachineId: workEntries.powerMachineId,
        implementMachineId: workEntries.implementMachineId,
      })
      .from(workEntries)
      .innerJoin(fields, and(eq(fields.operationId, workEntries.operationId), eq(fields.id, workEntries.fieldId)))
      .where(
        and(
          eq(workEntries.operationId, operationId),
          eq(workEntries.workDate, workDate),
          or(inArray(workEntries.powerMachineId, machineIds), inArray(workEntries.implementMachineId, machineIds)),
          exceptId ? ne(workEntries.id, exceptId) : undefined,
        ),
      );
  }

  async list(operationId: string, filter: WorkEntryFilter, scope: ListScope, window: ListWindow): Promise<{ rows: WorkEntryView[]; total: number; totals: { hours: string; acres: string; miles: string } }> {
    const where = whereOf(operationId, filter, scope);
    const [rows, [sums]] = await Promise.all([
      this.views(this.dbh.db)
        .where(where)
        .orderBy(...sortOf(filter.sort), asc(workEntries.id))
        .limit(window.limit)
        .offset(window.offset),
      this.dbh.db
        .select({
          total: sql<number>`count(*)::int`,
          hours: sql<string>`coalesce(sum(${workEntries.hours}), 0)::numeric(14,2)::text`,
          acres: sql<string>`coalesce(sum(${workEntries.acres}), 0)::numeric(16,3)::text`,
          miles: sql<string>`coalesce(sum(${workEntries.miles}), 0)::numeric(14,3)::text`,
        })
        .from(workEntries)
        .where(where),
    ]);
    return { rows: rows.map(flatten), total: sums!.total, totals: { hours: sums!.hours, acres: sums!.acres, miles: sums!.miles } };
  }

  /** The ids of every matching entry in table order: an export reads them in batches by id. */
  async matchingIds(operationId: string, filter: WorkEntryFilter, scope: ListScope, cap: number): Promise<string[]> {
    const rows = await this.dbh.db
      .select({ id: workEntries.id })
      .from(workEntries)
      .innerJoin(fields, and(eq(fields.operationId, workEntries.operationId), eq(fields.id, workEntries.fieldId)))
      .innerJoin(users, eq(users.id, workEntries.operatorUserId))
      .leftJoin(powerMachines, and(eq(powerMachines.operationId, workEntries.operationId), eq(powerMachines.id, workEntries.powerMachineId)))
      .leftJoin(implementMachines, and(eq(implementMachines.operationId, workEntries.operationId), eq(implementMachines.id, workEntries.implementMachineId)))
      .where(whereOf(operationId, filter, scope))
      .orderBy(...sortOf(filter.sort), asc(workEntries.id))
      .limit(cap);
    return rows.map((r) => r.id);
  }

  async viewsByIds(operationId: string, ids: string[]): Promise<WorkEntryView[]> {
    if (ids.length === 0) return [];
    const rows = await this.views(this.dbh.db).where(and(eq(workEntries.operationId, operationId), inArray(workEntries.id, ids)));
    const byId = new Map(rows.map((r) => [r.entry.id, flatten(r)]));
    return ids.map((id) => byId.get(id)).filter((v): v is WorkEntryView => v !== undefined);
  }
}

function flatten(row: { entry: WorkEntry } & Omit<WorkEntryView, keyof WorkEntry>): WorkEntryView {
  const { entry, ...names } = row;
  return { ...entry, ...names };
}
