import { Inject, Injectable } from '@nestjs/common';
import { and, eq, gte, inArray, lte, ne, or, sql, type SQL, type SQLWrapper } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { fields, invoiceEntries, machines, meterReadings, parties, users, workEntries, workTypes, type Executor, type NewWorkEntry, type WorkEntry } from '@hitchbook/db';
import type { WorkEntryFilter } from '@hitchbook/shared/schemas/work-entries';
import { DB, type DbHandle } from '../../core/database.js';
import { runPrepared } from '../../core/prepared.js';

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

interface SortKey {
  expr: SQLWrapper;
  dir: SQL;
}

const ASC = sql.raw('asc nulls last');
const DESC = sql.raw('desc nulls last');

/** The list's order, ending with the id so that pages never overlap. */
function sortKeysOf(sort: string): SortKey[] {
  const dir = sort.startsWith('-') ? DESC : ASC;
  const keys = ((): SortKey[] => {
    switch (sort.replace(/^-/, '')) {
      case 'hours':
        return [{ expr: workEntries.hours, dir }];
      case 'acres':
        return [{ expr: workEntries.acres, dir }];
      case 'field':
        return [{ expr: fields.name, dir }];
      case 'machine':
        return [{ expr: sql`coalesce(${powerMachines.name}, ${implementMachines.name})`, dir }, { expr: implementMachines.name, dir }];
      case 'operator':
        return [{ expr: users.name, dir }];
      case 'state':
        return [{ expr: STATE_ORDER, dir }];
      default:
        // A work date is never null, so where nulls go changes nothing for it; spelt this way both
        // directions follow the date-ordered indexes (read forward or backward) instead of sorting
        // every matching entry.
        return [
          { expr: workEntries.workDate, dir: dir === DESC ? DESC : sql.raw('asc nulls first') },
          { expr: workEntries.startedAt, dir },
          { expr: workEntries.createdAt, dir },
        ];
    }
  })();
  return [...keys, { expr: workEntries.id, dir: sql.raw('asc') }];
}

function orderOf(keys: SortKey[]): SQL {
  return sql.join(
    keys.map((k) => sql`${k.expr} ${k.dir}`),
    sql`, `,
  );
}

/** The names a sort orders by come from these tables; the other names are looked up for the page only. */
function sortJoinsOf(sort: string): SQL {
  switch (sort.replace(/^-/, '')) {
    case 'field':
      return sql` inner join ${fields} on ${and(eq(fields.operationId, workEntries.operationId), eq(fields.id, workEntries.fieldId))}`;
    case 'operator':
      return sql` inner join ${users} on ${eq(users.id, workEntries.operatorUserId)}`;
    case 'machine':
      return sql` left join ${machines} ${powerMachines} on ${and(eq(powerMachines.operationId, workEntries.operationId), eq(powerMachines.id, workEntries.powerMachineId))} left join ${machines} ${implementMachines} on ${and(eq(implementMachines.operationId, workEntries.operationId), eq(implementMachines.id, workEntries.implementMachineId))}`;
    default:
      return sql``;
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

/**
 * An entry matches a machine as its power unit or as its implement. Each is a separate branch, read
 * from its own machine-ordered index; the implement branch leaves out entries the power branch has.
 */
function machineBranches(machineId: string): [SQL, SQL] {
  return [
    eq(workEntries.powerMachineId, machineId),
    sql`${workEntries.implementMachineId} = ${machineId} and ${workEntries.powerMachineId} is distinct from ${machineId}`,
  ];
}

/** The ids of one page in the list's order. */
function pageIds(operationId: string, filter: WorkEntryFilter, scope: ListScope, window: ListWindow): SQL {
  const keys = sortKeysOf(filter.sort);
  const from = sql`${workEntries}${sortJoinsOf(filter.sort)}`;
  if (!filter.machineId) {
    return sql`select ${workEntries.id} from ${from} where ${whereOf(operationId, filter, scope)} order by ${orderOf(keys)} limit ${window.limit} offset ${window.offset}`;
  }
  // Each branch stops after the rows the page can reach; the page is then cut from the two merged.
  const others = whereOf(operationId, { ...filter, machineId: undefined }, scope);
  const columns = sql.join(
    keys.map((k, i) => sql`${k.expr} as ${sql.identifier(`k${i}`)}`),
    sql`, `,
  );
  const branches = machineBranches(filter.machineId).map(
    (machine) => sql`(select ${columns} from ${from} where ${others} and ${machine} order by ${orderOf(keys)} limit ${window.offset + window.limit})`,
  );
  const merged = keys.map((k, i) => ({ expr: sql`branch.${sql.identifier(`k${i}`)}`, dir: k.dir }));
  return sql`select ${merged.at(-1)!.expr} from (${sql.join(branches, sql` union all `)}) as branch order by ${orderOf(merged)} limit ${window.limit} offset ${window.offset}`;
}

/** The quantities of every matching entry, for the totals; with a machine, the union of its two branches. */
function matchingQuantities(operationId: string, filter: WorkEntryFilter, scope: ListScope): SQL {
  const quantities = sql`select ${workEntries.hours}, ${workEntries.acres}, ${workEntries.miles} from ${workEntries}`;
  if (!filter.machineId) return sql`${quantities} where ${whereOf(operationId, filter, scope)}`;
  const others = whereOf(operationId, { ...filter, machineId: undefined }, scope);
  return sql.join(
    machineBranches(filter.machineId).map((machine) => sql`${quantities} where ${others} and ${machine}`),
    sql` union all `,
  );
}

/** Names of a page's rows, one small lookup each, done after the page is cut. */
const pageNames = {
  fieldName: sql<string>`(select ${fields.name} from ${fields} where ${fields.operationId} = ${workEntries.operationId} and ${fields.id} = ${workEntries.fieldId})`,
  workTypeName: sql<string>`(select ${workTypes.name} from ${workTypes} where ${workTypes.operationId} = ${workEntries.operationId} and ${workTypes.id} = ${workEntries.workTypeId})`,
  powerMachineName: sql<string | null>`(select ${powerMachines.name} from ${machines} ${powerMachines} where ${powerMachines.operationId} = ${workEntries.operationId} and ${powerMachines.id} = ${workEntries.powerMachineId})`,
  implementMachineName: sql<string | null>`(select ${implementMachines.name} from ${machines} ${implementMachines} where ${implementMachines.operationId} = ${workEntries.operationId} and ${implementMachines.id} = ${workEntries.implementMachineId})`,
  operatorName: sql<string>`(select ${users.name} from ${users} where ${users.id} = ${workEntries.operatorUserId})`,
  billToName: sql<string>`(select ${parties.name} from ${parties} where ${parties.operationId} = ${workEntries.operationId} and ${parties.id} = ${workEntries.billToPartyId})`,
};

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

  /**
   * A page of the table and its totals. The page's ids are picked first, from the entry columns (and the
   * one table a name sort needs), so the names are looked up for those rows only and not for every
   * entry that matches; both statements are prepared, their plans kept per connection.
   */
  async list(operationId: string, filter: WorkEntryFilter, scope: ListScope, window: ListWindow): Promise<{ rows: WorkEntryView[]; total: number; totals: { hours: string; acres: string; miles: string } }> {
    const page = sql`unnest(array(${pageIds(operationId, filter, scope, window)})) with ordinality as page(id, pos)`;
    const [rows, [sums]] = await Promise.all([
      runPrepared(
        this.dbh.db
          .select({ entry: workEntries, ...pageNames })
          .from(workEntries)
          .innerJoin(page, sql`page.id = ${workEntries.id}`)
          .where(eq(workEntries.operationId, operationId))
          .orderBy(sql`page.pos`),
      ),
      runPrepared(
        this.dbh.db
          .select({
            total: sql<number>`count(*)::int`,
            hours: sql<string>`coalesce(sum(matching.hours), 0)::numeric(14,2)::text`,
            acres: sql<string>`coalesce(sum(matching.acres), 0)::numeric(16,3)::text`,
            miles: sql<string>`coalesce(sum(matching.miles), 0)::numeric(14,3)::text`,
          })
          .from(sql`(${matchingQuantities(operationId, filter, scope)}) as matching`),
      ),
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
      .orderBy(orderOf(sortKeysOf(filter.sort)))
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
