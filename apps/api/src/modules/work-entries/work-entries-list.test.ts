import Papa from 'papaparse';
import { sql } from 'drizzle-orm';
import { workEntries, type NewWorkEntry } from '@hitchbook/db';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createOperation, signInAll, type OperationFixture } from '../../test-support/fixtures.js';
import { createTestApp, type TestApp } from '../../test-support/test-app.js';
import { createFleet, type FleetFixture } from './test-helpers.js';

let t: TestApp;
let fx: OperationFixture;
let fleet: FleetFixture;
let tokens: Awaited<ReturnType<typeof signInAll>>;
let ids: Record<'e1' | 'e2' | 'e3' | 'e4' | 'e5', string>;
const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });

// Five entries with known figures; the tests only read them, so they share one operation.
beforeAll(async () => {
  t = await createTestApp();
  fx = await createOperation(t.dbh.db);
  fleet = await createFleet(t.dbh.db, fx);
  tokens = await signInAll(t, fx);
  const { operator, partner, owner } = fx.members;
  const base = { operationId: fx.operationId, createdBy: owner.userId };
  const rows: Array<Omit<NewWorkEntry, 'operationId'>> = [
    { workDate: '2025-05-01', fieldId: fleet.home40, workTypeId: fleet.mowing, powerMachineId: fleet.tractor, implementMachineId: fleet.cutter, operatorUserId: operator.userId, hours: '3.00', acres: '40.000', billToPartyId: fx.households[0], state: 'approved' },
    { workDate: '2025-05-02', fieldId: fleet.creek80, workTypeId: fleet.disking, powerMachineId: fleet.tractor, implementMachineId: fleet.disk, operatorUserId: partner.userId, hours: '6.50', acres: '78.500', billToPartyId: fx.customers[0], state: 'submitted' },
    { workDate: '2025-05-10', fieldId: fleet.townshipRoad, workTypeId: fleet.roadsideMowing, powerMachineId: fleet.tractor, implementMachineId: fleet.cutter, operatorUserId: operator.userId, hours: '2.25', acres: '2.000', miles: '2.000', billToPartyId: fx.customers[1], state: 'draft' },
    { workDate: '2025-06-01', fieldId: fleet.home40, workTypeId: fleet.disking, powerMachineId: fleet.windrower, operatorUserId: owner.userId, hours: '1.00', acres: '10.000', billToPartyId: fx.households[1], state: 'approved', notes: '=HYPERLINK("http://example.test/x","open")' },
    { workDate: '2025-06-15', fieldId: fleet.creek80, workTypeId: fleet.mowing, powerMachineId: fleet.tractor, implementMachineId: fleet.cutter, operatorUserId: operator.userId, hours: '4.00', acres: '30.000', billToPartyId: fx.customers[0], state: 'submitted', notes: '@SUM(1+1), then "more"' },
  ];
  const inserted = await t.dbh.db
    .insert(workEntries)
    .values(rows.map((r) => ({ ...base, ...r })))
    .returning({ id: workEntries.id });
  ids = { e1: inserted[0]!.id, e2: inserted[1]!.id, e3: inserted[2]!.id, e4: inserted[3]!.id, e5: inserted[4]!.id };
});
afterAll(() => t.close());

async function list(query: string, token = tokens.bookkeeper) {
  const res = await t.http().get(`/api/work-entries${query}`).set(bearer(token));
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body as { items: Array<Record<string, unknown> & { id: string }>; total: number; page: number; pageSize: number; totals: { hours: string; acres: string; miles: string } };
}

const order = (body: { items: Array<{ id: string }> }) => body.items.map((i) => Object.entries(ids).find(([, id]) => id === i.id)?.[0]);

describe('work-entries table', () => {
  it('pages on the server, newest first, with totals over every matching entry', async () => {
    const page2 = await list('?pageSize=2&page=2');
    expect(page2).toMatchObject({ total: 5, page: 2, pageSize: 2, totals: { hours: '16.75', acres: '160.500', miles: '2.000' } });
    expect(order(page2)).toEqual(['e3', 'e2']);
    expect(order(await list(''))).toEqual(['e5', 'e4', 'e3', 'e2', 'e1']);
  });

  it('carries the names the table shows', async () => {
    const body = await list(`?fieldId=${fleet.townshipRoad}`);
    expect(body.items[0]).toMatchObject({
      fieldName: 'Township Rd 12',
      workTypeName: 'Roadside mowing',
      powerMachineName: 'Red 7120',
      implementMachineName: 'Batwing 15',
      operatorName: expect.stringMatching(/^operator /),
      billToName: expect.stringMatching(/^Agency D /),
    });
  });

  it.each([
    ['dates', () => '?dateFrom=2025-05-02&dateTo=2025-06-01', ['e4', 'e3', 'e2'], '9.75'],
    ['a machine as implement', () => `?machineId=${fleet.cutter}`, ['e5', 'e3', 'e1'], '9.25'],
    ['a machine as power unit', () => `?machineId=${fleet.tractor}`, ['e5', 'e3', 'e2', 'e1'], '15.75'],
    ['a field', () => `?fieldId=${fleet.creek80}`, ['e5', 'e2'], '10.50'],
    ['an operator', () => `?operatorUserId=${fx.members.operator.userId}`, ['e5', 'e3', 'e1'], '9.25'],
    ['a bill-to party', () => `?billToPartyId=${fx.customers[0]}`, ['e5', 'e2'], '10.50'],
    ['states', () => '?state=submitted,approved', ['e5', 'e4', 'e2', 'e1'], '14.50'],
    ['a work type', () => `?workTypeId=${fleet.disking}`, ['e4', 'e2'], '7.50'],
    ['several at once', () => `?workTypeId=${fleet.mowing}&state=approved`, ['e1'], '3.00'],
  ])('filters by %s and totals the filtered set', async (_what, query, expected, hours) => {
    const body = await list(query());
    expect(order(body)).toEqual(expected);
    expect(body.total).toBe(expected.length);
    expect(body.totals.hours).toBe(hours);
  });

  it.each([
    ['hours', ['e4', 'e3', 'e1', 'e5', 'e2']],
    ['-hours', ['e2', 'e5', 'e1', 'e3', 'e4']],
    ['acres', ['e3', 'e4', 'e5', 'e1', 'e2']],
    ['state', ['e3', 'e2|e5', 'e2|e5', 'e1|e4', 'e1|e4']],
    ['-date', ['e5', 'e4', 'e3', 'e2', 'e1']],
  ])('sorts by %s', async (sort, expected) => {
    const got = order(await list(`?sort=${sort}`));
    expected.forEach((allowed, i) => expect(allowed.split('|')).toContain(got[i]));
  });

  it('sorts by field, machine and operator names', async () => {
    const byField = (await list('?sort=field')).items.map((i) => i.fieldName);
    expect(byField).toEqual(['Creek 80', 'Creek 80', 'Home 40', 'Home 40', 'Township Rd 12']);
    const byMachine = (await list('?sort=-machine')).items.map((i) => i.powerMachineName);
    expect(byMachine[0]).toBe('Swather 9');
    const byOperator = (await list('?sort=operator')).items.map((i) => String(i.operatorName).split(' ')[0]);
    expect(byOperator).toEqual(['operator', 'operator', 'operator', 'owner', 'partner']);
  });

  it('shows an operator only their own entries, their totals, and no money', async () => {
    const body = await list('', tokens.operator);
    expect(order(body)).toEqual(['e5', 'e3', 'e1']);
    expect(body.totals).toEqual({ hours: '9.25', acres: '72.000', miles: '2.000' });
    const keys = Object.keys(body.items[0]!);
    expect(keys.filter((k) => /amount|rate|price|cost|total/i.test(k))).toEqual([]);
    expect((await list(`?operatorUserId=${fx.members.partner.userId}`, tokens.operator)).total).toBe(0);
  });

  it('refuses customers and bad queries, naming the parameter', async () => {
    expect((await t.http().get('/api/work-entries').set(bearer(tokens.customer))).status).toBe(403);
    const bad = await t.http().get('/api/work-entries?sort=price&state=lost&page=0').set(bearer(tokens.owner));
    expect(bad.status).toBe(400);
    expect(bad.body.issues.map((i: { path: string }) => i.path).sort()).toEqual(['page', 'sort', 'state.0']);
  });

  it("never lists another operation's entries", async () => {
    const other = await createOperation(t.dbh.db);
    const [token] = Object.values(await signInAll(t, other));
    const body = await list('', token);
    expect(body.total).toBe(0);
  });
});

describe('work-entries table filtered by a machine that is a power unit on some entries and an implement on others', () => {
  let other: OperationFixture;
  let otherFleet: FleetFixture;
  let token: string;
  let stored: Array<{ id: string; workDate: string; startedAt: Date | null; hours: string; acres: string | null; miles: string | null; state: string; fieldName: string }>;

  // The same machine in either column, once in both; ties on the date are broken by the start time.
  beforeAll(async () => {
    other = await createOperation(t.dbh.db, 'Shared tractor');
    otherFleet = await createFleet(t.dbh.db, other);
    token = (await signInAll(t, other)).bookkeeper;
    const m = otherFleet.tractor;
    const base = { operationId: other.operationId, createdBy: other.members.owner.userId, operatorUserId: other.members.operator.userId, workTypeId: otherFleet.mowing, billToPartyId: other.households[0] };
    const at = (iso: string) => new Date(iso);
    const rows: Array<Omit<NewWorkEntry, 'operationId' | 'operatorUserId' | 'workTypeId' | 'billToPartyId'>> = [
      { workDate: '2025-04-01', fieldId: otherFleet.home40, powerMachineId: m, hours: '1.00', acres: '5.000', state: 'approved' },
      { workDate: '2025-04-03', fieldId: otherFleet.creek80, powerMachineId: otherFleet.windrower, implementMachineId: m, hours: '2.00', acres: '6.000', state: 'submitted' },
      { workDate: '2025-04-03', fieldId: otherFleet.home40, powerMachineId: m, implementMachineId: otherFleet.cutter, hours: '3.50', acres: '7.000', startedAt: at('2025-04-03T08:00:00Z'), state: 'approved' },
      { workDate: '2025-04-03', fieldId: otherFleet.townshipRoad, implementMachineId: m, hours: '0.75', acres: '2.000', miles: '2.000', startedAt: at('2025-04-03T13:00:00Z'), state: 'draft' },
      { workDate: '2025-05-20', fieldId: otherFleet.creek80, powerMachineId: m, implementMachineId: m, hours: '4.25', acres: '8.500', state: 'approved' },
      { workDate: '2025-06-02', fieldId: otherFleet.home40, implementMachineId: m, hours: '5.00', acres: '9.000', state: 'approved' },
      { workDate: '2025-07-09', fieldId: otherFleet.creek80, powerMachineId: m, hours: '6.10', acres: '10.000', state: 'submitted' },
      { workDate: '2024-12-30', fieldId: otherFleet.home40, powerMachineId: m, hours: '2.20', acres: '1.000', state: 'approved' },
      // Not the machine's work: never listed nor totalled.
      { workDate: '2025-05-01', fieldId: otherFleet.home40, powerMachineId: otherFleet.windrower, implementMachineId: otherFleet.disk, hours: '9.00', acres: '99.000', state: 'approved' },
      { workDate: '2025-05-02', fieldId: otherFleet.creek80, hours: '8.00', acres: '88.000', state: 'approved' },
    ];
    await t.dbh.db.insert(workEntries).values(rows.map((r) => ({ ...base, ...r })));
    const found = await t.dbh.db.execute<{ id: string; work_date: string; started_at: string | null; hours: string; acres: string | null; miles: string | null; state: string; field_name: string }>(sql`
      select e.id, e.work_date::text as work_date, e.started_at, e.hours::text as hours, e.acres::text as acres, e.miles::text as miles, e.state, f.name as field_name
      from work_entries e join fields f on f.id = e.field_id
      where e.operation_id = ${other.operationId} and (e.power_machine_id = ${m} or e.implement_machine_id = ${m})`);
    stored = found.rows.map((r) => ({ id: r.id, workDate: r.work_date, startedAt: r.started_at ? new Date(r.started_at) : null, hours: r.hours, acres: r.acres, miles: r.miles, state: r.state, fieldName: r.field_name }));
  });

  const byDateDesc = (a: (typeof stored)[number], b: (typeof stored)[number]) =>
    b.workDate.localeCompare(a.workDate) || (a.startedAt && b.startedAt ? b.startedAt.getTime() - a.startedAt.getTime() : a.startedAt ? -1 : b.startedAt ? 1 : 0) || (a.id < b.id ? -1 : 1);

  async function pages(query: string, pageSize: number) {
    const first = await list(`${query}&pageSize=${pageSize}&page=1`, token);
    const all = [...first.items];
    for (let page = 2; page <= Math.ceil(first.total / pageSize) + 1; page++) {
      const next = await list(`${query}&pageSize=${pageSize}&page=${page}`, token);
      expect(next.total).toBe(first.total);
      expect(next.totals).toEqual(first.totals);
      all.push(...next.items);
    }
    return { first, ids: all.map((i) => i.id) };
  }

  it('lists each entry once, in date order across both columns, page after page', async () => {
    const inYear = stored.filter((e) => e.workDate >= '2025-01-01' && e.workDate <= '2025-12-31');
    const { first, ids } = await pages(`?machineId=${otherFleet.tractor}&dateFrom=2025-01-01&dateTo=2025-12-31&sort=-date`, 2);
    expect(first.total).toBe(7);
    expect(ids).toEqual([...inYear].sort(byDateDesc).map((e) => e.id));
    expect(first.items[0]).toMatchObject({ fieldName: 'Creek 80', powerMachineName: 'Red 7120', implementMachineName: null, workTypeName: 'Mowing (rotary)', billToName: expect.stringMatching(/^Household A /) });
  });

  it('gives the same rows in the reverse order sorted oldest first, and an empty page past the end', async () => {
    const { ids } = await pages(`?machineId=${otherFleet.tractor}&sort=date`, 3);
    const newest = await pages(`?machineId=${otherFleet.tractor}&sort=-date`, 3);
    expect(new Set(ids)).toEqual(new Set(stored.map((e) => e.id)));
    expect(ids[0]).toBe(stored.find((e) => e.workDate === '2024-12-30')!.id);
    expect(newest.ids).toEqual([...stored].sort(byDateDesc).map((e) => e.id));
    const past = await list(`?machineId=${otherFleet.tractor}&pageSize=3&page=9`, token);
    expect(past).toMatchObject({ items: [], total: 8, page: 9 });
  });

  it.each([
    ['-hours', (a: (typeof stored)[number], b: (typeof stored)[number]) => Number(b.hours) - Number(a.hours)],
    ['field', (a: (typeof stored)[number], b: (typeof stored)[number]) => a.fieldName.localeCompare(b.fieldName) || (a.id < b.id ? -1 : 1)],
  ])('keeps the order sorted by %s across pages', async (sort, compare) => {
    const { ids } = await pages(`?machineId=${otherFleet.tractor}&sort=${sort}`, 2);
    expect(ids).toEqual([...stored].sort(compare).map((e) => e.id));
  });

  it('totals equal the sums over the entries that name the machine in either column', async () => {
    const [direct] = (
      await t.dbh.db.execute<{ n: number; hours: string; acres: string; miles: string }>(sql`
        select count(*)::int as n, sum(hours)::numeric(14,2)::text as hours, sum(acres)::numeric(16,3)::text as acres, coalesce(sum(miles), 0)::numeric(14,3)::text as miles
        from work_entries where operation_id = ${other.operationId} and work_date between '2025-01-01' and '2025-12-31'
          and (power_machine_id = ${otherFleet.tractor} or implement_machine_id = ${otherFleet.tractor}) and state in ('approved', 'submitted')`)
    ).rows;
    const body = await list(`?machineId=${otherFleet.tractor}&dateFrom=2025-01-01&dateTo=2025-12-31&state=approved,submitted&pageSize=2&page=2`, token);
    expect(direct!.n).toBe(6);
    expect(body.total).toBe(direct!.n);
    expect(body.totals).toEqual({ hours: direct!.hours, acres: direct!.acres, miles: direct!.miles });
    expect(body.totals).toEqual({ hours: '21.85', acres: '45.500', miles: '0.000' });
  });

  it('shows an operator only their own entries of the machine', async () => {
    const { operator } = await signInAll(t, other);
    const body = await list(`?machineId=${otherFleet.tractor}`, operator);
    expect(body.total).toBe(8);
    const partnerView = await list(`?machineId=${otherFleet.tractor}&operatorUserId=${other.members.partner.userId}`, token);
    expect(partnerView.total).toBe(0);
  });

  it("finds nothing through another operation's machine", async () => {
    const body = await list(`?machineId=${otherFleet.tractor}`, tokens.bookkeeper);
    expect(body).toMatchObject({ items: [], total: 0, totals: { hours: '0.00', acres: '0.000', miles: '0.000' } });
  });
});

describe('CSV export', () => {
  async function exportCsv(query: string, token = tokens.bookkeeper) {
    const res = await t.http().get(`/api/work-entries/export.csv${query}`).set(bearer(token)).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks).toString('utf8')));
    });
    return { res, text: res.body as string };
  }

  it('downloads the filtered entries as an attachment, UTF-8 with a BOM', async () => {
    const { res, text } = await exportCsv(`?fieldId=${fleet.creek80}`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="work-entries-\d{4}-\d{2}-\d{2}\.csv"/);
    expect(text.startsWith('\uFEFFdate,state,operator,field,work type,')).toBe(true);
    const rows = Papa.parse<string[]>(text.slice(1), { skipEmptyLines: true }).data;
    expect(rows).toHaveLength(3);
    expect(rows.slice(1).map((r) => [r[0], r[3], r[11], r[13]])).toEqual([
      ['2025-06-15', 'Creek 80', '4.00', '30.000'],
      ['2025-05-02', 'Creek 80', '6.50', '78.500'],
    ]);
    const submitted = Papa.parse<string[]>((await exportCsv(`?fieldId=${fleet.creek80}&state=submitted,draft`)).text.slice(1), { skipEmptyLines: true }).data;
    expect(submitted.slice(1).map((r) => [r[0], r[1]])).toEqual([
      ['2025-06-15', 'submitted'],
      ['2025-05-02', 'submitted'],
    ]);
    expect((await exportCsv('?state=draft')).text.split('\n').filter(Boolean)).toHaveLength(2);
  });

  it('neutralises cells a spreadsheet would run as formulas and keeps quotes and commas inside one cell (OWASP CSV Injection)', async () => {
    const { text } = await exportCsv('');
    expect(text).toContain(`"'=HYPERLINK(""http://example.test/x"",""open"")"`);
    const rows = Papa.parse<string[]>(text.slice(1), { skipEmptyLines: true }).data;
    const notes = rows.slice(1).map((r) => r[19]).filter(Boolean);
    expect(notes).toEqual([`'@SUM(1+1), then "more"`, `'=HYPERLINK("http://example.test/x","open")`]);
  });

  it("gives an operator only their own entries and refuses customers", async () => {
    const { text } = await exportCsv('', tokens.operator);
    const rows = Papa.parse<string[]>(text.slice(1), { skipEmptyLines: true }).data;
    expect(rows.slice(1).map((r) => r[0])).toEqual(['2025-06-15', '2025-05-10', '2025-05-01']);
    expect((await t.http().get('/api/work-entries/export.csv').set(bearer(tokens.customer))).status).toBe(403);
  });
});
