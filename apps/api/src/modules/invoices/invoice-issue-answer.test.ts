import { eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { fields, workEntries } from '@hitchbook/db';
import { createOperation, signIn, type OperationFixture } from '../../test-support/fixtures.js';
import { createTestApp, type TestApp } from '../../test-support/test-app.js';
import { addEntry, addNeighbourSheet, createBillingWorld, type BillingWorld } from './billing-world.fixture.js';

// Issuing answers with the invoice built from what its own transaction read and wrote, and the
// entries' move to invoiced leaves the machine sums as a count from scratch gives them.

let t: TestApp;
const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });

beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

interface Outfit {
  world: BillingWorld<OperationFixture>;
  owner: string;
  neighbour: string;
}

async function outfit(): Promise<Outfit> {
  const world = await createBillingWorld(t.dbh.db, await createOperation(t.dbh.db));
  await addNeighbourSheet(t.dbh.db, world);
  return { world, owner: (await signIn(t, world.fx.members.owner.email)).token, neighbour: world.fx.customers[0] };
}

async function draft(o: Outfit, from: string, to: string): Promise<{ id: string }> {
  const res = await t.http().post('/api/invoices/drafts').set(bearer(o.owner)).send({ partyId: o.neighbour, from, to });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body;
}

/**
 * Both sums counted from the entries as they stand, the way migration 0009 backfilled them, next to the
 * kept ones, each as sorted text rows.
 */
async function sumsOf(operationId: string): Promise<{ kept: string[]; counted: string[] }> {
  const months = await t.dbh.db.execute<{ row: string }>(sql`
    select concat_ws(' ', 'month', month, machine_id, household_id, entries, hours) as row from machine_household_months where operation_id = ${operationId}`);
  const years = await t.dbh.db.execute<{ row: string }>(sql`
    select concat_ws(' ', 'year', year, machine_id, work_type_id, entries, hours, acres) as row from machine_work_type_years where operation_id = ${operationId}`);
  const countedMonths = await t.dbh.db.execute<{ row: string }>(sql`
    select concat_ws(' ', 'month', date_trunc('month', e.work_date)::date, m.machine_id, h.household_id, count(*), sum(e.hours)::numeric(14,2)) as row
    from work_entries e
    join parties bp on bp.operation_id = e.operation_id and bp.id = e.bill_to_party_id
    join fields f on f.operation_id = e.operation_id and f.id = e.field_id
    left join parties fo on fo.operation_id = e.operation_id and fo.id = f.owner_party_id
    cross join lateral (select work_sum_household(e.state, bp.id, bp.kind, fo.id, fo.kind) as household_id) h
    cross join lateral (values (e.power_machine_id), (e.implement_machine_id)) as m(machine_id)
    where e.operation_id = ${operationId} and m.machine_id is not null and h.household_id is not null
    group by date_trunc('month', e.work_date), m.machine_id, h.household_id`);
  const countedYears = await t.dbh.db.execute<{ row: string }>(sql`
    select concat_ws(' ', 'year', extract(year from e.work_date)::int, m.machine_id, e.work_type_id, count(*), sum(e.hours)::numeric(14,2), sum(coalesce(e.acres, 0))::numeric(16,3)) as row
    from work_entries e
    cross join lateral (values (e.power_machine_id), (e.implement_machine_id)) as m(machine_id)
    where e.operation_id = ${operationId} and m.machine_id is not null and e.state in ('approved', 'invoiced', 'squared')
    group by extract(year from e.work_date), m.machine_id, e.work_type_id`);
  const sorted = (rows: Array<{ row: string }>) => rows.map((r) => r.row).sort();
  return { kept: sorted([...months.rows, ...years.rows]), counted: sorted([...countedMonths.rows, ...countedYears.rows]) };
}

describe('the answer to an issue', () => {
  it('is the invoice exactly as it reads afterwards, entries in date, field and id order', async () => {
    const o = await outfit();
    const { mowing, roadside } = o.world.workTypes;
    const { creekBottom, schoolhouse, ditch } = o.world.fields;
    const spec = { billToPartyId: o.neighbour, hours: '2.00' };
    // Two entries on one field and day, so the order needs its last key.
    const ids = [
      await addEntry(t.dbh.db, o.world, { ...spec, workDate: '2025-06-03', workTypeId: mowing, fieldId: schoolhouse, acres: '30.000' }),
      await addEntry(t.dbh.db, o.world, { ...spec, workDate: '2025-06-02', workTypeId: mowing, fieldId: schoolhouse, acres: '12.500' }),
      await addEntry(t.dbh.db, o.world, { ...spec, workDate: '2025-06-02', workTypeId: mowing, fieldId: creekBottom, acres: '10.000' }),
      await addEntry(t.dbh.db, o.world, { ...spec, workDate: '2025-06-02', workTypeId: mowing, fieldId: creekBottom, acres: '4.250' }),
      await addEntry(t.dbh.db, o.world, { ...spec, workDate: '2025-06-01', workTypeId: roadside, fieldId: ditch, miles: '2.500' }),
    ];
    const d = await draft(o, '2025-06-01', '2025-06-30');

    const issued = await t.http().post(`/api/invoices/${d.id}/issue`).set(bearer(o.owner)).send({});
    expect(issued.status, JSON.stringify(issued.body)).toBe(200);
    const read = await t.http().get(`/api/invoices/${d.id}`).set(bearer(o.owner));
    expect(read.status).toBe(200);
    expect(issued.body).toEqual(read.body);

    expect(issued.body.entryCount).toBe(5);
    expect(issued.body).not.toHaveProperty('entries');

    // The customer's view lists the billed entries, in the lines' order, with what the customer may see of each.
    const customer = (await signIn(t, o.world.fx.members.customer.email)).token;
    const theirs = await t.http().get(`/api/invoices/${d.id}`).set(bearer(customer));
    expect(theirs.status).toBe(200);
    const creekPair = [ids[2], ids[3]].sort();
    expect(theirs.body.entries.map((e: { id: string }) => e.id)).toEqual([ids[4], ...creekPair, ids[1], ids[0]]);
    expect(theirs.body.entries[0]).toEqual({ id: ids[4], workDate: '2025-06-01', fieldName: 'Tamarack Road ditch', workTypeName: 'Roadside mowing', hours: '2.00', acres: null, miles: '2.500', loads: null, eachCount: null });
    expect(theirs.body).toMatchObject({ entryCount: 5, lines: issued.body.lines });
  });
});

describe('the machine sums through billing', () => {
  it('stay as counted from scratch when customer work is issued and voided, and when household work changes state', async () => {
    const o = await outfit();
    // Customer work on a household's field counts for that household's use while approved or invoiced.
    await t.dbh.db.update(fields).set({ ownerPartyId: o.world.fx.households[0] }).where(eq(fields.id, o.world.fields.creekBottom));
    const spec = { workTypeId: o.world.workTypes.mowing, fieldId: o.world.fields.creekBottom, hours: '3.00', acres: '20.000' };
    for (const day of ['2025-07-01', '2025-07-02', '2025-08-05']) await addEntry(t.dbh.db, o.world, { ...spec, workDate: day, billToPartyId: o.neighbour });
    const family = await addEntry(t.dbh.db, o.world, { ...spec, workDate: '2025-07-03', billToPartyId: o.world.fx.households[1] });
    const before = await sumsOf(o.world.fx.operationId);
    expect(before.kept).toEqual(before.counted);
    expect(before.kept.length).toBeGreaterThan(0);

    const d = await draft(o, '2025-07-01', '2025-08-31');
    expect((await t.http().post(`/api/invoices/${d.id}/issue`).set(bearer(o.owner)).send({})).status).toBe(200);
    const issued = await sumsOf(o.world.fx.operationId);
    expect(issued.kept).toEqual(issued.counted);
    expect(issued.kept).toEqual(before.kept);

    expect((await t.http().post(`/api/invoices/${d.id}/void`).set(bearer(o.owner)).send({ reason: 'Wrong month' })).status).toBe(200);
    const voided = await sumsOf(o.world.fx.operationId);
    expect(voided.kept).toEqual(voided.counted);
    expect(voided.kept).toEqual(before.kept);

    // Household work only counts while approved or squared: the same move does change its sums.
    await t.dbh.db.update(workEntries).set({ state: 'invoiced' }).where(eq(workEntries.id, family));
    const moved = await sumsOf(o.world.fx.operationId);
    expect(moved.kept).toEqual(moved.counted);
    expect(moved.kept).not.toEqual(before.kept);
  });
});
