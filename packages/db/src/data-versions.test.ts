import { randomUUID } from 'node:crypto';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const url = process.env.DATABASE_URL;
if (!url) throw new Error('DATABASE_URL is not set: run the tests through `npm test`.');

// Tables holding an operation's rows that do not move its data version, and why: nothing an answer shows
// comes from them, or they are written only inside a statement on a table that moves it.
const NOT_VERSIONED: Record<string, string> = {
  audit_log: 'read only by the audit reader, which is never kept',
  idempotency_keys: 'replays of writes, never part of an answer',
  machine_household_months: 'written only by the work_entries statement that moves the version',
  machine_work_type_years: 'written only by the work_entries statement that moves the version',
  operation_data_changes: 'the notes themselves',
  operation_data_versions: 'the versions themselves',
};

const a = new pg.Client({ connectionString: url });
const b = new pg.Client({ connectionString: url });
let opA: string;
let opB: string;

beforeAll(async () => {
  await a.connect();
  await b.connect();
  opA = await newOperation('Version A');
  opB = await newOperation('Version B');
});
afterAll(async () => {
  await a.query('delete from operations where id = any($1)', [[opA, opB]]);
  await a.end();
  await b.end();
});

async function newOperation(name: string): Promise<string> {
  const { rows } = await a.query<{ id: string }>('insert into operations (name) values ($1) returning id', [`${name} ${randomUUID().slice(0, 8)}`]);
  return rows[0]!.id;
}

async function version(operationId: string): Promise<number> {
  const { rows } = await a.query<{ v: string }>('select coalesce((select version from operation_data_versions where operation_id = $1), 0)::text as v', [operationId]);
  return Number(rows[0]!.v);
}

async function addHousehold(client: pg.Client, operationId: string, name: string): Promise<string> {
  const { rows } = await client.query<{ id: string }>("insert into parties (operation_id, kind, name, relationship) values ($1, 'household', $2, 'family') returning id", [operationId, name]);
  return rows[0]!.id;
}

describe("an operation's data version", () => {
  it('is kept by triggers on every table of an operation’s rows but the ones named as exceptions', async () => {
    const { rows } = await a.query<{ table_name: string; events: string[] }>(`
      select c.table_name, coalesce(array_agg(distinct t.event_manipulation::text) filter (where t.trigger_name like c.table_name || '_data_change_%'), '{}') as events
      from information_schema.columns c
      join information_schema.tables tb on tb.table_schema = c.table_schema and tb.table_name = c.table_name and tb.table_type = 'BASE TABLE'
      left join information_schema.triggers t on t.event_object_schema = c.table_schema and t.event_object_table = c.table_name
      where c.table_schema = 'public' and c.column_name = 'operation_id'
      group by c.table_name order by c.table_name`);
    const uncovered = rows.filter((r) => !(r.table_name in NOT_VERSIONED) && ['DELETE', 'INSERT', 'UPDATE'].some((e) => !r.events.includes(e)));
    expect(uncovered.map((r) => r.table_name)).toEqual([]);
    // The exceptions still exist, so the list does not outlive its tables.
    const names = new Set(rows.map((r) => r.table_name));
    expect(Object.keys(NOT_VERSIONED).filter((t) => !names.has(t))).toEqual([]);
  });

  it('moves once per committed transaction, only for the operations it wrote, and leaves no notes behind', async () => {
    const [beforeA, beforeB] = [await version(opA), await version(opB)];
    await a.query('begin');
    const id = await addHousehold(a, opA, 'Household one');
    await a.query("update parties set name = 'Household one, renamed' where id = $1", [id]);
    await addHousehold(a, opA, 'Household two');
    // Not yet visible to anyone else, and not published before the commit.
    expect((await b.query('select version from operation_data_versions where operation_id = $1', [opA])).rows[0]?.version ?? '0').toBe(String(beforeA));
    await a.query('commit');
    expect(await version(opA)).toBe(beforeA + 1);
    expect(await version(opB)).toBe(beforeB);
    expect((await a.query('select count(*)::int as n from operation_data_changes')).rows[0].n).toBe(0);

    await a.query('delete from parties where id = $1', [id]);
    expect(await version(opA)).toBe(beforeA + 2);
  });

  it('does not move for a rolled-back transaction or a rolled-back savepoint alone', async () => {
    const before = await version(opA);
    await a.query('begin');
    await addHousehold(a, opA, 'Never kept');
    await a.query('rollback');
    expect(await version(opA)).toBe(before);

    await a.query('begin');
    await a.query('savepoint s');
    await addHousehold(a, opA, 'Undone');
    await a.query('rollback to savepoint s');
    await a.query('commit');
    expect(await version(opA)).toBe(before);
  });

  it("moves for a rename of the operation and of a member, whose names answers carry", async () => {
    const before = await version(opB);
    await a.query("update operations set name = name || ' (renamed)' where id = $1", [opB]);
    expect(await version(opB)).toBe(before + 1);

    const { rows } = await a.query<{ id: string }>("insert into users (email, name, password_hash) values ($1, 'Member', 'x') returning id", [`member-${randomUUID().slice(0, 8)}@example.test`]);
    const userId = rows[0]!.id;
    await a.query("insert into memberships (operation_id, user_id, role, status) values ($1, $2, 'operator', 'active')", [opB, userId]);
    const joined = await version(opB);
    expect(joined).toBe(before + 2);
    await a.query("update users set name = 'Member, renamed' where id = $1", [userId]);
    expect(await version(opB)).toBe(joined + 1);
    // A sign-in stamp or password change is not part of any answer.
    await a.query("update users set password_hash = 'y' where id = $1", [userId]);
    expect(await version(opB)).toBe(joined + 1);
    await a.query('delete from memberships where user_id = $1', [userId]);
    await a.query('delete from users where id = $1', [userId]);
  });

  it('lets two writers of one operation meet on a row without deadlocking on the version', async () => {
    const before = await version(opA);
    const x = await addHousehold(a, opA, 'Row X');
    const y = await addHousehold(a, opA, 'Row Y');
    await a.query('begin');
    await b.query('begin');
    await a.query("update parties set notes = 'a' where id = $1", [x]);
    await b.query("update parties set notes = 'b' where id = $1", [y]);
    // a now waits for b's row; b commits, taking the version's lock only then, and a carries on.
    const aWaits = a.query("update parties set notes = 'a' where id = $1", [y]);
    await b.query('commit');
    await aWaits;
    await a.query('commit');
    expect(await version(opA)).toBe(before + 4);
    await a.query('delete from parties where id = any($1)', [[x, y]]);
  });
});
