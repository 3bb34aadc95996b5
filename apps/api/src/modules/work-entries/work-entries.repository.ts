import { Inject, Injectable } from '@nestjs/common';
import { and, eq, getTableColumns, gte, inArray, lte, ne, or, sql, type Placeholder, type SQL, type SQLWrapper } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { fields, invoiceEntries, machines, meterReadings, parties, users, workEntries, workTypes, type Executor, type NewWorkEntry, type WorkEntry } from '@hitchbook/db';
import type { WorkEntryFilter } from '@hitchbook/shared/schemas/work-entries';
import { columnsOf } from '../../common/sql-arrays.js';
import { DB, type DbHandle } from '../../core/database.js';
import { statementName } from '../../core/prepared.js';
import type { EntryColumns } from './entry-draft.js';

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

/** An entry as an import stores it. */
export type ImportedEntry = EntryColumns & { state: WorkEntry['state']; submittedAt: Date; importKey: string; createdBy: string };

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

type Bound = string | Placeholder;

/** What narrows a listing, each as a value or, for a prepared statement, a placeholder of the same name. */
interface Conditions {
  operationId: Bound;
  ownUserId?: Bound;
  dateFrom?: Bound;
  dateTo?: Bound;
  machineId?: Bound;
  fieldId?: Bound;
  operatorUserId?: Bound;
  billToPartyId?: Bound;
  workTypeId?: Bound;
  states?: readonly string[] | Placeholder;
}

function conditionsOf(operationId: string, filter: Omit<WorkEntryFilter, 'sort'>, scope: ListScope): Conditions {
  const { dateFrom, dateTo, machineId, fieldId, operatorUserId, billToPartyId, workTypeId, state } = filter;
  const all: Conditions = { operationId, ownUserId: scope.operatorUserId, dateFrom, dateTo, machineId, fieldId, operatorUserId, billToPartyId, workTypeId, states: state };
  return Object.fromEntries(Object.entries(all).filter(([, v]) => v !== undefined)) as unknown as Conditions;
}

/** The same conditions with every value replaced by a placeholder named after it. */
function placeheld(conditions: Conditions): Conditions {
  return Object.fromEntries(Object.keys(conditions).map((k) => [k, sql.placeholder(k)])) as unknown as Conditions;
}

/** Every filter is a condition on the entry itself, so the totals need no joins. */
function whereOf(c: Conditions): SQL {
  return and(
    eq(workEntries.operationId, c.operationId),
    c.ownUserId ? eq(workEntries.operatorUserId, c.ownUserId) : undefined,
    c.dateFrom ? gte(workEntries.workDate, c.dateFrom) : undefined,
    c.dateTo ? lte(workEntries.workDate, c.dateTo) : undefined,
    c.machineId ? or(eq(workEntries.powerMachineId, c.machineId), eq(workEntries.implementMachineId, c.machineId)) : undefined,
    c.fieldId ? eq(workEntries.fieldId, c.fieldId) : undefined,
    c.operatorUserId ? eq(workEntries.operatorUserId, c.operatorUserId) : undefined,
    c.billToPartyId ? eq(workEntries.billToPartyId, c.billToPartyId) : undefined,
    c.workTypeId ? eq(workEntries.workTypeId, c.workTypeId) : undefined,
    // One array parameter, so the statement is the same whichever states are asked for.
    c.states ? sql`${workEntries.state} = any(${Array.isArray(c.states) ? sql.param(c.states) : c.states}::text[])` : undefined,
  )!;
}

/**
 * An entry matches a machine as its power unit or as its implement. Each is a separate branch, read
 * from its own machine-ordered index; the implement branch leaves out entries the power branch has.
 */
function machineBranches(machineId: Bound): [SQL, SQL] {
  return [
    eq(workEntries.powerMachineId, machineId),
    sql`${workEntries.implementMachineId} = ${machineId} and ${workEntries.powerMachineId} is distinct from ${machineId}`,
  ];
}

/** The ids of one page in the list's order; `limit`, `offset` and `reach` (their sum) are placeholders. */
function pageIds(c: Conditions, sort: string): SQL {
  const keys = sortKeysOf(sort);
  const from = sql`${workEntries}${sortJoinsOf(sort)}`;
  const [limit, offset] = [sql.placeholder('limit'), sql.placeholder('offset')];
  if (!c.machineId) {
    return sql`select ${workEntries.id} from ${from} where ${whereOf(c)} order by ${orderOf(keys)} limit ${limit} offset ${offset}`;
  }
  // Each branch stops after the rows the page can reach; the page is then cut from the two merged.
  const others = whereOf({ ...c, machineId: undefined });
  const columns = sql.join(
    keys.map((k, i) => sql`${k.expr} as ${sql.identifier(`k${i}`)}`),
    sql`, `,
  );
  const branches = machineBranches(c.machineId).map(
    (machine) => sql`(select ${columns} from ${from} where ${others} and ${machine} order by ${orderOf(keys)} limit ${sql.placeholder('reach')})`,
  );
  const merged = keys.map((k, i) => ({ expr: sql`branch.${sql.identifier(`k${i}`)}`, dir: k.dir }));
  return sql`select ${merged.at(-1)!.expr} from (${sql.join(branches, sql` union all `)}) as branch order by ${orderOf(merged)} limit ${limit} offset ${offset}`;
}

/** The quantities of every matching entry, for the totals; with a machine, the union of its two branches. */
function matchingQuantities(c: Conditions): SQL {
  const quantities = sql`select ${workEntries.hours}, ${workEntries.acres}, ${workEntries.miles} from ${workEntries}`;
  if (!c.machineId) return sql`${quantities} where ${whereOf(c)}`;
  const others = whereOf({ ...c, machineId: undefined });
  return sql.join(
    machineBranches(c.machineId).map((machine) => sql`${quantities} where ${others} and ${machine}`),
    sql` union all `,
  );
}

/** The names an entry is shown with, from the joins every view of entries makes. */
const NAME_COLUMNS = {
  fieldName: fields.name,
  workTypeName: workTypes.name,
  powerMachineName: powerMachines.name,
  implementMachineName: implementMachines.name,
  operatorName: users.name,
  billToName: parties.name,
};

/** Every query is scoped by the operation id passed first. */
@Injectable()
export class WorkEntriesRepository {
  constructor(@Inject(DB) private readonly dbh: DbHandle) {}

  private views(executor: Executor) {
    return executor
      .select({
        entry: workEntries,
        ...NAME_COLUMNS,
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
   * Locks the entry for the rest of the transaction and tells whether an invoice or a draft holds it:
   * drafting takes the same lock, so an entry cannot be changed and put on a draft at once.
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

  /**
   * One batch of imported entries in one statement, each column as one array parameter: a multi-row insert
   * built with a parameter per cell costs more to build and bind than PostgreSQL takes to store the rows.
   * A row whose import key another upload stored meanwhile is left out of the answer.
   */
  async insertImported(operationId: string, rows: ImportedEntry[], tx: Executor): Promise<Array<{ id: string; importKey: string }>> {
    if (rows.length === 0) return [];
    const column = columnsOf(rows);
    const instant = (d: Date | null) => d?.toISOString() ?? null;
    const result = await tx.execute<{ id: string; importKey: string }>(sql`
      insert into work_entries (operation_id, work_date, operator_user_id, field_id, work_type_id, power_machine_id, implement_machine_id,
        meter_start, meter_end, started_at, ended_at, hours, operator_hours, acres, miles, loads, each_count, fuel_gallons,
        bill_to_party_id, notes, state, submitted_at, import_key, created_by)
      select ${operationId}::uuid, r.* from unnest(
        ${column('date', (r) => r.workDate)}, ${column('uuid', (r) => r.operatorUserId)}, ${column('uuid', (r) => r.fieldId)},
        ${column('uuid', (r) => r.workTypeId)}, ${column('uuid', (r) => r.powerMachineId)}, ${column('uuid', (r) => r.implementMachineId)},
        ${column('numeric', (r) => r.meterStart)}, ${column('numeric', (r) => r.meterEnd)},
        ${column('timestamptz', (r) => instant(r.startedAt))}, ${column('timestamptz', (r) => instant(r.endedAt))},
        ${column('numeric', (r) => r.hours)}, ${column('numeric', (r) => r.operatorHours)}, ${column('numeric', (r) => r.acres)},
        ${column('numeric', (r) => r.miles)}, ${column('numeric', (r) => r.loads)}, ${column('numeric', (r) => r.eachCount)},
        ${column('numeric', (r) => r.fuelGallons)}, ${column('uuid', (r) => r.billToPartyId)}, ${column('text', (r) => r.notes)},
        ${column('text', (r) => r.state)}, ${column('timestamptz', (r) => instant(r.submittedAt))}, ${column('text', (r) => r.importKey)},
        ${column('uuid', (r) => r.createdBy)}
      ) as r
      on conflict (operation_id, import_key) do nothing
      returning id, import_key as "importKey"`);
    return result.rows;
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
   * entry that matches. Both statements are built once for each combination of filters and sort, with
   * placeholders for the values, and prepared, so neither drizzle nor PostgreSQL plans them again: the
   * names are joined to the page, a join search the cached generic plan makes once per connection.
   */
  async list(operationId: string, filter: WorkEntryFilter, scope: ListScope, window: ListWindow): Promise<{ rows: WorkEntryView[]; total: number; totals: { hours: string; acres: string; miles: string } }> {
    const conditions = conditionsOf(operationId, filter, scope);
    const statements = this.listStatements(conditions, filter.sort);
    const values = { ...conditions, limit: window.limit, offset: window.offset, reach: window.offset + window.limit };
    const [rows, [sums]] = await Promise.all([statements.page.execute(values), statements.totals.execute(values)]);
    return { rows, total: sums!.total, totals: { hours: sums!.hours, acres: sums!.acres, miles: sums!.miles } };
  }

  private readonly listStatementCache = new Map<string, ReturnType<WorkEntriesRepository['prepareList']>>();

  private listStatements(conditions: Conditions, sort: string): ReturnType<WorkEntriesRepository['prepareList']> {
    const shape = `${sort}:${Object.keys(conditions).join(',')}`;
    let statements = this.listStatementCache.get(shape);
    if (!statements) {
      statements = this.prepareList(placeheld(conditions), sort);
      this.listStatementCache.set(shape, statements);
    }
    return statements;
  }

  private prepareList(c: Conditions, sort: string) {
    const page = sql`unnest(array(${pageIds(c, sort)})) with ordinality as page(id, pos)`;
    const pageQuery = this.dbh.db
      .select({
        ...getTableColumns(workEntries),
        ...NAME_COLUMNS,
      })
      .from(workEntries)
      .innerJoin(page, sql`page.id = ${workEntries.id}`)
      .innerJoin(fields, and(eq(fields.operationId, workEntries.operationId), eq(fields.id, workEntries.fieldId)))
      .innerJoin(workTypes, and(eq(workTypes.operationId, workEntries.operationId), eq(workTypes.id, workEntries.workTypeId)))
      .innerJoin(parties, and(eq(parties.operationId, workEntries.operationId), eq(parties.id, workEntries.billToPartyId)))
      .innerJoin(users, eq(users.id, workEntries.operatorUserId))
      .leftJoin(powerMachines, and(eq(powerMachines.operationId, workEntries.operationId), eq(powerMachines.id, workEntries.powerMachineId)))
      .leftJoin(implementMachines, and(eq(implementMachines.operationId, workEntries.operationId), eq(implementMachines.id, workEntries.implementMachineId)))
      .where(eq(workEntries.operationId, c.operationId))
      .orderBy(sql`page.pos`);
    const totalsQuery = this.dbh.db
      .select({
        total: sql<number>`count(*)::int`,
        hours: sql<string>`coalesce(sum(matching.hours), 0)::numeric(14,2)::text`,
        acres: sql<string>`coalesce(sum(matching.acres), 0)::numeric(16,3)::text`,
        miles: sql<string>`coalesce(sum(matching.miles), 0)::numeric(14,3)::text`,
      })
      .from(sql`(${matchingQuantities(c)}) as matching`);
    return {
      page: pageQuery.prepare(statementName(pageQuery.toSQL().sql)),
      totals: totalsQuery.prepare(statementName(totalsQuery.toSQL().sql)),
    };
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
      .where(whereOf(conditionsOf(operationId, filter, scope)))
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
