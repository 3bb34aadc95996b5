import { sql, type SQL } from 'drizzle-orm';
import { operations, parties, fields as fieldsTable, workEntries } from '@hitchbook/db';
import { inShareSet, periodMonths, shareSetsCte, statementUseSumsQuery, usesCte, type PeriodScope } from '@hitchbook/db/square-up-sums';
import { and, eq, inArray } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createOperation, signInAll, type OperationFixture } from '../../test-support/fixtures.js';
import { createTestApp, type TestApp } from '../../test-support/test-app.js';
import { Ledger } from '../square-ups/ledger.fixture.js';
import { createFleet, type FleetFixture } from '../work-entries/test-helpers.js';

// The kept sums of work (machine_household_months, machine_work_type_years) are written by triggers in
// the transaction of every write to work_entries, fields and parties. Each test changes entries the way
// the product does and compares the sums with the same figures aggregated from the entries themselves.

let t: TestApp;

beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

type Row = Record<string, unknown>;

async function rows(query: SQL): Promise<string[]> {
  const result = await t.dbh.db.execute<Row>(query);
  return result.rows.map((r) => JSON.stringify(r)).sort();
}

/** Both kept tables next to the entries' own aggregation, for one operation. */
async function sumsAndEntries(operationId: string) {
  const kept = {
    households: await rows(sql`
      select month::text, machine_id, household_id, entries, hours::text from machine_household_months where operation_id = ${operationId}`),
    workTypes: await rows(sql`
      select year, machine_id, work_type_id, entries, hours::text, acres::text from machine_work_type_years where operation_id = ${operationId}`),
  };
  const direct = {
    households: await rows(sql`
      select date_trunc('month', u.work_date)::date::text as month, u.machine_id, u.household_id, count(*)::int as entries, sum(u.hours)::numeric(14, 2)::text as hours
      from (
        select m.machine_id, we.work_date, we.hours,
               case when bp.kind = 'household' then case when we.state in ('approved', 'squared') then bp.id end
                    when fo.kind = 'household' and we.state in ('approved', 'invoiced', 'squared') then fo.id end as household_id
        from work_entries we
        cross join lateral (values (we.power_machine_id), (we.implement_machine_id)) as m(machine_id)
        join parties bp on bp.operation_id = we.operation_id and bp.id = we.bill_to_party_id
        join fields f on f.operation_id = we.operation_id and f.id = we.field_id
        left join parties fo on fo.operation_id = we.operation_id and fo.id = f.owner_party_id
        where we.operation_id = ${operationId} and m.machine_id is not null
      ) u
      where u.household_id is not null
      group by 1, 2, 3`),
    workTypes: await rows(sql`
      select extract(year from we.work_date)::int as year, m.machine_id, we.work_type_id, count(*)::int as entries,
             sum(we.hours)::numeric(14, 2)::text as hours, sum(coalesce(we.acres, 0))::numeric(16, 3)::text as acres
      from work_entries we
      cross join lateral (values (we.power_machine_id), (we.implement_machine_id)) as m(machine_id)
      where we.operation_id = ${operationId} and m.machine_id is not null and we.state in ('approved', 'invoiced', 'squared')
      group by 1, 2, 3`),
  };
  return { kept, direct };
}

async function expectSumsMatchEntries(operationId: string): Promise<void> {
  const { kept, direct } = await sumsAndEntries(operationId);
  expect(kept.households).toEqual(direct.households);
  expect(kept.workTypes).toEqual(direct.workTypes);
}

interface World {
  fx: OperationFixture;
  fleet: FleetFixture;
  ledger: Ledger;
  entries: string[];
}

/** Entries over two years and several months: household work, customer work on a household's field and elsewhere, every state. */
async function world(): Promise<World> {
  const fx = await createOperation(t.dbh.db, 'Kept sums');
  const fleet = await createFleet(t.dbh.db, fx);
  const ledger = new Ledger(t.dbh.db, fx);
  const [hA, hB] = fx.households;
  const [cC] = fx.customers;
  const entries = [
    await ledger.entry({ date: '2024-12-30', fieldId: fleet.home40, billTo: hA, hours: '3.00', acres: '40', power: fleet.tractor, implement: fleet.cutter, workTypeId: fleet.mowing }),
    await ledger.entry({ date: '2025-01-05', fieldId: fleet.home40, billTo: cC, hours: '2.50', acres: '40', power: fleet.tractor, implement: fleet.disk, workTypeId: fleet.disking, state: 'invoiced' }),
    await ledger.entry({ date: '2025-01-20', fieldId: fleet.creek80, billTo: cC, hours: '4.25', acres: '78.5', power: fleet.tractor, implement: fleet.disk, workTypeId: fleet.disking, state: 'invoiced' }),
    await ledger.entry({ date: '2025-01-31', fieldId: fleet.creek80, billTo: hB, hours: '1.75', power: fleet.windrower, workTypeId: fleet.mowing, state: 'squared' }),
    await ledger.entry({ date: '2025-02-01', fieldId: fleet.home40, billTo: hB, hours: '6.00', acres: '40', power: fleet.tractor, implement: fleet.cutter, workTypeId: fleet.mowing, state: 'submitted' }),
    await ledger.entry({ date: '2025-02-14', fieldId: fleet.townshipRoad, billTo: hA, hours: '2.00', acres: '2', power: fleet.tractor, implement: fleet.cutter, workTypeId: fleet.roadsideMowing }),
    await ledger.entry({ date: '2025-03-03', fieldId: fleet.home40, billTo: hA, hours: '0.50', workTypeId: fleet.mowing, state: 'draft' }),
  ];
  return { fx, fleet, ledger, entries };
}

const setEntries = (ids: string[], values: Partial<typeof workEntries.$inferInsert>) =>
  t.dbh.db.update(workEntries).set(values).where(inArray(workEntries.id, ids));

describe('kept sums of work', () => {
  it('hold every inserted entry of each machine under its household, month, work type and year', async () => {
    const w = await world();
    await expectSumsMatchEntries(w.fx.operationId);
    const [january] = await rows(sql`
      select hours::text, entries from machine_household_months
      where operation_id = ${w.fx.operationId} and machine_id = ${w.fleet.tractor} and month = '2025-01-01' and household_id = ${w.fx.households[0]}`);
    // Only the customer work on Home 40 counts for household A in January: Creek 80 has no owner.
    expect(JSON.parse(january!)).toEqual({ hours: '2.50', entries: 1 });
  });

  it('follow an entry moved to another month, year, machine and work type, and changed hours and acres', async () => {
    const w = await world();
    await setEntries([w.entries[0]!], { workDate: '2025-02-03' });
    await setEntries([w.entries[2]!], { powerMachineId: w.fleet.windrower, implementMachineId: null, workTypeId: w.fleet.mowing });
    await setEntries([w.entries[5]!], { hours: '3.75', acres: null });
    await setEntries([w.entries[3]!], { notes: 'a note moves nothing' });
    await expectSumsMatchEntries(w.fx.operationId);
    const moved = await rows(sql`select year from machine_work_type_years where operation_id = ${w.fx.operationId} and year = 2024`);
    expect(moved).toEqual([]);
  });

  it('follow state changes in both directions, one entry or many in one statement', async () => {
    const w = await world();
    await setEntries([w.entries[4]!, w.entries[6]!], { state: 'approved' });
    await expectSumsMatchEntries(w.fx.operationId);
    await setEntries([w.entries[0]!, w.entries[4]!, w.entries[5]!], { state: 'squared' });
    await expectSumsMatchEntries(w.fx.operationId);
    await setEntries([w.entries[1]!, w.entries[2]!], { state: 'approved' });
    await setEntries(w.entries, { state: 'draft' });
    await expectSumsMatchEntries(w.fx.operationId);
    const left = await rows(sql`
      select 1 from machine_household_months where operation_id = ${w.fx.operationId}
      union all select 1 from machine_work_type_years where operation_id = ${w.fx.operationId}`);
    expect(left).toEqual([]);
  });

  it('drop deleted entries and remove the rows they leave empty', async () => {
    const w = await world();
    await t.dbh.db.delete(workEntries).where(inArray(workEntries.id, [w.entries[3]!, w.entries[5]!]));
    await expectSumsMatchEntries(w.fx.operationId);
    const windrower = await rows(sql`select 1 from machine_household_months where operation_id = ${w.fx.operationId} and machine_id = ${w.fleet.windrower}`);
    expect(windrower).toEqual([]);
  });

  it('move customer work to the field’s new owner, and work to a party that becomes a household or a customer', async () => {
    const w = await world();
    await t.dbh.db.update(fieldsTable).set({ ownerPartyId: w.fx.households[1] }).where(eq(fieldsTable.id, w.fleet.home40));
    await t.dbh.db.update(fieldsTable).set({ ownerPartyId: w.fx.households[0] }).where(eq(fieldsTable.id, w.fleet.creek80));
    await expectSumsMatchEntries(w.fx.operationId);
    await t.dbh.db.update(fieldsTable).set({ ownerPartyId: null }).where(eq(fieldsTable.id, w.fleet.creek80));
    await t.dbh.db.update(parties).set({ kind: 'customer' }).where(eq(parties.id, w.fx.households[1]));
    await expectSumsMatchEntries(w.fx.operationId);
    await t.dbh.db.update(parties).set({ kind: 'household' }).where(inArray(parties.id, [w.fx.households[1], w.fx.customers[0]]));
    await expectSumsMatchEntries(w.fx.operationId);
  });

  it('stay exact when a write is rolled back, and go with a deleted operation', async () => {
    const w = await world();
    const before = await sumsAndEntries(w.fx.operationId);
    await expect(
      t.dbh.db.transaction(async (tx) => {
        await tx.update(workEntries).set({ state: 'approved', hours: '9.00' }).where(eq(workEntries.operationId, w.fx.operationId));
        throw new Error('undone');
      }),
    ).rejects.toThrow('undone');
    expect((await sumsAndEntries(w.fx.operationId)).kept).toEqual(before.kept);
    await t.dbh.db.delete(operations).where(eq(operations.id, w.fx.operationId));
    const left = await rows(sql`
      select 1 from machine_household_months where operation_id = ${w.fx.operationId}
      union all select 1 from machine_work_type_years where operation_id = ${w.fx.operationId}`);
    expect(left).toEqual([]);
  });

  it('hold the entries of a CSV import', async () => {
    const w = await world();
    const tokens = await signInAll(t, w.fx);
    const [hA] = await t.dbh.db.select({ name: parties.name }).from(parties).where(and(eq(parties.id, w.fx.households[0])));
    const [cC] = await t.dbh.db.select({ name: parties.name }).from(parties).where(and(eq(parties.id, w.fx.customers[0])));
    const op = w.fx.members.operator.email;
    const lines = ['Date,Field,Work Type,Power Unit,Implement,Operator E-mail,Hours,Meter Start,Meter End,Acres,Miles,Fuel Gallons,Bill To,Notes'];
    for (let day = 1; day <= 28; day++) {
      lines.push(`2025-04-${String(day).padStart(2, '0')},Home 40,Mowing (rotary),Red 7120,Batwing 15,${op},${(day % 5) + 1},,,,,,${day % 2 ? hA!.name : cC!.name},`);
      lines.push(`2025-05-${String(day).padStart(2, '0')},Creek 80,disking,T-3,Tandem 21,${op},2.25,,,,,,${cC!.name},`);
    }
    const res = await t
      .http()
      .post('/api/work-entries/import?kind=entries&mode=commit')
      .set({ Authorization: `Bearer ${tokens.owner}` })
      .attach('file', Buffer.from(lines.join('\r\n'), 'utf8'), { filename: 'entries.csv', contentType: 'text/csv' });
    expect(res.status).toBe(200);
    expect(res.body.created).toBe(56);
    await setEntries((await t.dbh.db.select({ id: workEntries.id }).from(workEntries).where(eq(workEntries.operationId, w.fx.operationId))).map((r) => r.id), { state: 'approved' });
    await expectSumsMatchEntries(w.fx.operationId);
  });
});

/** The period's use groups summed entry by entry, without the kept sums: the statement's figures before there were any. */
function entryByEntryUseSums(period: PeriodScope): SQL {
  return sql`
    with ${shareSetsCte(period.operationId)},
    family_sheets as (
      select id, effective_from, lead(effective_from) over (order by effective_from, created_at) as next_from
      from rate_sheets
      where operation_id = ${period.operationId} and relationship = 'family' and party_id is null and archived_at is null
    ),
    ${usesCte(period)}
    select u.machine_id as "machineId", u.household_id as "householdId", ss.effective_from::text as "shareSetFrom",
           fs.id as "rateSheetId", mr.rate_per_hour::text as "ratePerHour", sum(u.hours)::text as hours, count(*)::int as entries
    from uses u
    left join share_sets ss on ${inShareSet('ss', sql`u.machine_id`, sql`u.work_date`)}
    left join family_sheets fs on fs.effective_from <= u.work_date and (fs.next_from is null or u.work_date < fs.next_from)
    left join machine_rates mr on mr.operation_id = ${period.operationId} and mr.rate_sheet_id = fs.id and mr.machine_id = u.machine_id
    group by 1, 2, 3, 4, 5
    order by 1, 2, 3, 4`;
}

describe('a period’s use from the kept sums', () => {
  it('splits a period into its whole months and the part months around them', () => {
    expect(periodMonths('2025-01-01', '2025-12-31')).toEqual({ firstMonth: '2025-01-01', lastMonth: '2025-12-01', partRanges: [] });
    expect(periodMonths('2024-03-15', '2025-02-10')).toEqual({
      firstMonth: '2024-04-01',
      lastMonth: '2025-01-01',
      partRanges: [
        ['2024-03-15', '2024-03-31'],
        ['2025-02-01', '2025-02-10'],
      ],
    });
    expect(periodMonths('2024-02-01', '2024-02-29')).toEqual({ firstMonth: '2024-02-01', lastMonth: '2024-02-01', partRanges: [] });
    expect(periodMonths('2025-06-03', '2025-06-20')).toEqual({ firstMonth: null, lastMonth: null, partRanges: [['2025-06-03', '2025-06-20']] });
    expect(periodMonths('2025-06-03', '2025-07-31')).toEqual({ firstMonth: '2025-07-01', lastMonth: '2025-07-01', partRanges: [['2025-06-03', '2025-06-30']] });
  });

  it('gives the same groups as summing the entries, with share sets and family sheets starting mid-month', async () => {
    const w = await world();
    const [hA, hB] = w.fx.households;
    await w.ledger.shares(w.fleet.tractor, '2024-01-01', [[hA, '100']]);
    await w.ledger.shares(w.fleet.tractor, '2025-01-18', [[hA, '50'], [hB, '50']]);
    await w.ledger.shares(w.fleet.cutter, '2024-06-01', [[hB, '100']]);
    await w.ledger.rateSheet({ relationship: 'family', effectiveFrom: '2024-01-01', machineRates: [[w.fleet.tractor, '40'], [w.fleet.cutter, '12']] });
    await w.ledger.rateSheet({ relationship: 'family', effectiveFrom: '2025-02-10', machineRates: [[w.fleet.tractor, '44']] });
    await setEntries([w.entries[4]!, w.entries[6]!], { state: 'approved' });
    const periods: Array<[string, string]> = [
      ['2025-01-01', '2025-12-31'],
      ['2024-12-15', '2025-02-20'],
      ['2025-01-18', '2025-01-31'],
      ['2024-01-01', '2025-12-31'],
      ['2025-03-01', '2025-03-31'],
    ];
    for (const [from, to] of periods) {
      const period = { operationId: w.fx.operationId, from, to };
      const kept = await t.dbh.db.execute<Row>(statementUseSumsQuery(period));
      const direct = await t.dbh.db.execute<Row>(entryByEntryUseSums(period));
      expect(kept.rows, `${from} to ${to}`).toEqual(direct.rows);
    }
    const year = await t.dbh.db.execute<Row>(statementUseSumsQuery({ operationId: w.fx.operationId, from: '2025-01-01', to: '2025-12-31' }));
    // The tractor's January is read entry by entry (a share set starts on the 18th), and so is every machine's
    // February (a family sheet starts on the 10th): a February entry is priced by the sheet of its own day.
    expect(year.rows.filter((r) => r.machineId === w.fleet.tractor).map((r) => [r.householdId, r.shareSetFrom, r.ratePerHour, r.hours])).toEqual(
      expect.arrayContaining([
        [hA, '2024-01-01', '40.0000', '2.50'],
        [hB, '2025-01-18', '40.0000', '6.00'],
        [hA, '2025-01-18', '44.0000', '2.00'],
      ]),
    );
  });
});
