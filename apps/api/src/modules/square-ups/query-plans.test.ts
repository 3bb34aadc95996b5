import { sql, type SQL } from 'drizzle-orm';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import type { Executor } from '@hitchbook/db';
import { createOperation, type OperationFixture } from '../../test-support/fixtures.js';
import { createTestApp, type TestApp } from '../../test-support/test-app.js';
import { CustomIncomeRepository } from '../reports/custom-income.repository.js';
import { MachineRatesService } from '../reports/machine-rates.service.js';
import { WorkEntriesRepository } from '../work-entries/work-entries.repository.js';
import { statementSums, yearBounds } from '@hitchbook/db/square-up-sums';
import { Ledger } from './ledger.fixture.js';
import { StatementRepository } from './statement.repository.js';

// A year's square-up and machine rates must read that year through the indexes, so their time does
// not grow with the other years kept. Ten years of entries in two operations give the planner real
// choices; every query the features run is captured and its plan read back with EXPLAIN.

const YEARS = 10;
const ENTRIES_PER_OPERATION = 20_000;

let t: TestApp;
let op: OperationFixture;
let history: History;

interface PlanNode {
  'Node Type': string;
  'Relation Name'?: string;
  'Index Name'?: string;
  'Index Cond'?: string;
  Plans?: PlanNode[];
}

function nodes(plan: PlanNode): PlanNode[] {
  return [plan, ...(plan.Plans ?? []).flatMap(nodes)];
}

/** An executor that records the statements it is given and answers none of them. */
function recorder(): { executor: Executor; queries: SQL[] } {
  const queries: SQL[] = [];
  const executor = {
    execute: async (query: SQL) => {
      queries.push(query);
      return { rows: [] };
    },
  } as unknown as Executor;
  return { executor, queries };
}

async function scansOf(queries: readonly SQL[], table: string, executor: Executor = t.dbh.db): Promise<PlanNode[][]> {
  const scans: PlanNode[][] = [];
  for (const query of queries) {
    const result = await executor.execute<{ 'QUERY PLAN': Array<{ Plan: PlanNode }> }>(sql`explain (format json) ${query}`);
    const plan = result.rows[0]!['QUERY PLAN'][0]!.Plan;
    // A bitmap scan names the table on its heap node and the index on its child nodes.
    const onTable = nodes(plan).filter((n) => n['Relation Name'] === table || n['Index Name']?.startsWith(`${table}_`));
    if (onTable.length > 0) scans.push(onTable);
  }
  return scans;
}

const workEntryScans = (queries: readonly SQL[]) => scansOf(queries, 'work_entries');

/**
 * Kept sums are read for the period asked through their key, so the other years' rows stay unread. This
 * history's sums fill a few pages, where reading them whole is cheapest; with that priced out, the plan
 * shows whether an index bounds the read by the period.
 */
async function expectBoundedBy(queries: readonly SQL[], table: string, column: string): Promise<void> {
  const scans = await t.dbh.db.transaction(async (tx) => {
    await tx.execute(sql`set local enable_seqscan = off`);
    return scansOf(queries, table, tx);
  });
  expect(scans.length, table).toBeGreaterThan(0);
  for (const scan of scans) {
    expect(scan.map((n) => n['Node Type']), table).not.toContain('Seq Scan');
    expect(scan.map((n) => n['Index Cond'] ?? '').join(' '), table).toContain(column);
  }
}

interface History {
  tractor: string;
  cart: string;
  field: string;
  workType: string;
}

/** The statements a repository sends while `run` runs, captured from every pg client with their parameters. */
async function sentStatements(run: () => Promise<unknown>): Promise<Array<{ text: string; values: unknown[] }>> {
  const sent: Array<{ text: string; values: unknown[] }> = [];
  const original = pg.Client.prototype.query;
  const spy = vi.spyOn(pg.Client.prototype, 'query').mockImplementation(function (this: pg.Client, ...args: unknown[]) {
    const config = args[0] as string | { text: string; values?: unknown[] };
    if (typeof config === 'string') sent.push({ text: config, values: (args[1] as unknown[]) ?? [] });
    else if (config?.text) sent.push({ text: config.text, values: config.values ?? (args[1] as unknown[]) ?? [] });
    return (original as (...a: unknown[]) => unknown).apply(this, args);
  } as typeof original);
  try {
    await run();
  } finally {
    spy.mockRestore();
  }
  return sent;
}

const readsEntries = (s: { text: string }) => s.text.includes('"work_entries"') || s.text.includes('work_entries ');
const onWorkEntries = (plan: PlanNode) => nodes(plan).filter((n) => n['Relation Name'] === 'work_entries' || n['Index Name']?.startsWith('work_entries_'));

async function workEntryScansOfSent(sent: Array<{ text: string; values: unknown[] }>): Promise<PlanNode[][]> {
  const scans: PlanNode[][] = [];
  for (const { text, values } of sent.filter(readsEntries)) {
    const result = await t.dbh.pool.query<{ 'QUERY PLAN': Array<{ Plan: PlanNode }> }>(`explain (format json) ${text}`, values);
    // A bitmap scan names the table on its heap node and the index on its child nodes.
    const onEntries = onWorkEntries(result.rows[0]!['QUERY PLAN'][0]!.Plan);
    if (onEntries.length > 0) scans.push(onEntries);
  }
  return scans;
}

/** The plans a prepared statement settles on after its first executions: generic, made without the parameters' values. */
async function genericWorkEntryScans(sent: Array<{ text: string; values: unknown[] }>): Promise<PlanNode[][]> {
  const scans: PlanNode[][] = [];
  const client = await t.dbh.pool.connect();
  const literal = (value: unknown): string =>
    Array.isArray(value) ? client.escapeLiteral(`{${value.map((v) => `"${String(v).replace(/["\\]/g, '\\$&')}"`).join(',')}}`) : client.escapeLiteral(String(value));
  try {
    await client.query('set plan_cache_mode = force_generic_plan');
    for (const [i, { text, values }] of sent.filter(readsEntries).entries()) {
      await client.query(`prepare generic_${i} as ${text}`);
      const args = values.map(literal).join(', ');
      const result = await client.query<{ 'QUERY PLAN': Array<{ Plan: PlanNode }> }>(`explain (format json) execute generic_${i}${args ? `(${args})` : ''}`);
      await client.query(`deallocate generic_${i}`);
      const onEntries = onWorkEntries(result.rows[0]!['QUERY PLAN'][0]!.Plan);
      if (onEntries.length > 0) scans.push(onEntries);
    }
  } finally {
    await client.query('reset plan_cache_mode');
    client.release();
  }
  return scans;
}

/** An index scan over the whole operation is no better than a sequential one: the year must bound the read. */
function expectBoundedByDate(scans: PlanNode[][], label: string): void {
  for (const scan of scans) {
    expect(scan.map((n) => n['Node Type']), label).not.toContain('Seq Scan');
    expect(scan.map((n) => n['Index Cond'] ?? '').join(' '), label).toContain('work_date');
  }
}

async function fillHistory(fx: OperationFixture): Promise<History> {
  const ledger = new Ledger(t.dbh.db, fx);
  const [tractor, cart] = [await ledger.machine('History tractor'), await ledger.machine('History cart', { classId: 'grain-cart', kind: 'implement' })];
  // The tractor pulls one entry in five, as one power unit of a fleet does, so the plan of its list does not
  // hinge on what other tests left in the table.
  const others = [await ledger.machine('History tractor 2'), await ledger.machine('History tractor 3'), await ledger.machine('History tractor 4'), await ledger.machine('History tractor 5')];
  await ledger.shares(tractor, '2015-01-01', [[fx.households[0], '60'], [fx.households[1], '40']]);
  await ledger.shares(cart, '2015-01-01', [[fx.households[1], '100']]);
  const field = await ledger.field('History field', '80', fx.households[0]);
  const workType = await ledger.workType('Grain cart');
  await t.dbh.db.execute(sql`
    insert into work_entries (operation_id, work_date, operator_user_id, field_id, power_machine_id, implement_machine_id, work_type_id, hours, acres, bill_to_party_id, state)
    select ${fx.operationId}, date '2016-01-01' + (g % (365 * ${YEARS})), ${fx.members.operator.userId}, ${field}, (array[${tractor}::uuid, ${others[0]}::uuid, ${others[1]}::uuid, ${others[2]}::uuid, ${others[3]}::uuid])[1 + g % 5], case when g % 2 = 0 then ${cart}::uuid end,
           ${workType}, 2.5, 20, case when g % 3 = 0 then ${fx.customers[0]}::uuid when g % 2 = 0 then ${fx.households[0]}::uuid else ${fx.households[1]}::uuid end,
           (array['draft', 'submitted', 'invoiced', 'approved', 'approved', 'approved', 'squared'])[1 + g % 7]
    from generate_series(1, ${ENTRIES_PER_OPERATION}) as g`);
  await t.dbh.db.execute(sql`
    insert into cost_entries (operation_id, machine_id, category, incurred_on, amount, paid_by_party_id)
    select ${fx.operationId}, ${tractor}, (array['fuel', 'repair', 'parts', 'insurance'])[1 + g % 4], date '2016-01-01' + (g % (365 * ${YEARS})), 120.50, ${fx.households[0]}
    from generate_series(1, ${ENTRIES_PER_OPERATION / 4}) as g`);
  return { tractor, cart, field, workType };
}

beforeAll(async () => {
  t = await createTestApp();
  op = await createOperation(t.dbh.db, 'Ten years');
  history = await fillHistory(op);
  await fillHistory(await createOperation(t.dbh.db, 'Neighbouring outfit'));
  await t.dbh.db.execute(sql`analyze work_entries`);
  await t.dbh.db.execute(sql`analyze cost_entries`);
}, 120_000);
afterAll(() => t.close());

describe('query plans of a year’s reports', () => {
  it('reads work entries through an index in every square-up statement query', async () => {
    const { executor, queries } = recorder();
    const statements = t.app.get(StatementRepository);
    const period = { operationId: op.operationId, from: '2025-01-01', to: '2025-12-31' };
    const lines = { household: op.households[0], machine: null, fixedCostsBy: 'ownership' as const, limit: 100, offset: 0 };
    await statementSums(executor, period);
    await statements.costLines(period, lines, executor);
    await statements.workLines(period, lines, executor);
    const scans = await workEntryScans(queries);
    // The use sums' part months, the pending count, and both drill-downs (the cost lines read use for the split basis).
    expect(scans.length).toBeGreaterThanOrEqual(4);
    for (const scan of scans) expect(scan.map((n) => n['Node Type'])).not.toContain('Seq Scan');
    await expectBoundedBy(queries, 'machine_household_months', 'month');
  });

  it('reads work entries through an index in every machine-rates and field-cost query', async () => {
    const { executor, queries } = recorder();
    await t.app.get(MachineRatesService).report(op.operationId, { year: 2025 }, executor);
    const income = t.app.get(CustomIncomeRepository);
    await income.fieldWork(op.operationId, yearBounds(2025), executor);
    await income.machineFieldHours(op.operationId, yearBounds(2025), executor);
    const scans = await workEntryScans(queries);
    // Invoiced work and the two field-cost queries; hours, acres and the neighbour sheet's rates come from the kept sums.
    expect(scans.length).toBeGreaterThanOrEqual(3);
    for (const scan of scans) expect(scan.map((n) => n['Node Type'])).not.toContain('Seq Scan');
    await expectBoundedBy(queries, 'machine_work_type_years', 'year');
  });
});

describe('query plans of the work-entry list', () => {
  const year = { dateFrom: '2025-01-01', dateTo: '2025-12-31' };
  const filters = (): Array<[string, Record<string, unknown>]> => [
    ['the year', {}],
    ['the year and a machine', { machineId: history.cart }],
    ['the year and a power unit', { machineId: history.tractor }],
    ['the year and a field', { fieldId: history.field }],
    ['the year and an operator', { operatorUserId: op.members.operator.userId }],
    ['the year and who is billed', { billToPartyId: op.customers[0] }],
    ['the year and a work type', { workTypeId: history.workType }],
    ['the year and states', { state: ['draft', 'submitted'] }],
  ];

  it('reads work entries through an index for a page and its totals, whatever filter is added to the year', async () => {
    const entries = t.app.get(WorkEntriesRepository);
    for (const [label, extra] of filters()) {
      for (const sort of ['-date', 'date']) {
        const sent = await sentStatements(() => entries.list(op.operationId, { ...year, ...extra, sort } as never, {}, { limit: 50, offset: 0 }));
        const scans = await workEntryScansOfSent(sent);
        // The page of rows and the count with its sums.
        expect(scans.length, label).toBe(2);
        expectBoundedByDate(scans, `${label}, sorted ${sort}`);
      }
    }
  });

  it('keeps reading through date-bounded indexes once the prepared statements use their generic plans', async () => {
    const entries = t.app.get(WorkEntriesRepository);
    for (const [label, extra] of filters()) {
      const sent = await sentStatements(() => entries.list(op.operationId, { ...year, ...extra, sort: '-date' } as never, {}, { limit: 50, offset: 100 }));
      const scans = await genericWorkEntryScans(sent);
      expect(scans.length, label).toBe(2);
      expectBoundedByDate(scans, `${label}, generic plan`);
    }
  });

  it("reads a machine's page and totals from its two machine-ordered indexes, without visiting other entries", async () => {
    const sent = await sentStatements(() => t.app.get(WorkEntriesRepository).list(op.operationId, { ...year, machineId: history.tractor, sort: '-date' } as never, {}, { limit: 50, offset: 0 }));
    const scans = await workEntryScansOfSent(sent);
    expect(scans).toHaveLength(2);
    const indexes = scans.map((scan) => scan.map((n) => n['Index Name']).filter(Boolean));
    for (const used of indexes) expect(used).toEqual(expect.arrayContaining(['work_entries_operation_power_recent_idx', 'work_entries_operation_implement_recent_idx']));
    // The page is ordered by the index and cut there, so no sort of the machine's year happens. The page and
    // its totals are sent at the same time on two connections, so which one comes first varies: the page is the
    // statement with a limit.
    const page = await workEntryScansOfSent(sent.filter((s) => readsEntries(s) && /\blimit\b/i.test(s.text)));
    expect(page).toHaveLength(1);
    expect(page[0]!.map((n) => n['Node Type'])).not.toContain('Bitmap Heap Scan');
  });

  it('reads work entries through an index for an operator who sees only their own entries', async () => {
    const sent = await sentStatements(() => t.app.get(WorkEntriesRepository).list(op.operationId, { ...year, sort: '-date' } as never, { operatorUserId: op.members.operator.userId }, { limit: 50, offset: 0 }));
    const scans = await workEntryScansOfSent(sent);
    expect(scans.length).toBe(2);
    expectBoundedByDate(scans, 'own entries');
  });
});
