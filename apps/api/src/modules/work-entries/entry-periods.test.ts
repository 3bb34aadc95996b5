import { count, eq } from 'drizzle-orm';
import { workEntries } from '@hitchbook/db';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createOperation, signInAll } from '../../test-support/fixtures.js';
import { createTestApp, type TestApp } from '../../test-support/test-app.js';
import { createFleet } from './test-helpers.js';

let t: TestApp;
const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });

beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

async function outfit() {
  const fx = await createOperation(t.dbh.db);
  const fleet = await createFleet(t.dbh.db, fx);
  const tokens = await signInAll(t, fx);
  const log = async (workDate: string, state: 'draft' | 'submitted' = 'submitted', token = tokens.operator) => {
    const res = await t
      .http()
      .post('/api/work-entries')
      .set(bearer(token))
      .send({ workDate, fieldId: fleet.home40, workTypeId: fleet.mowing, billToPartyId: fx.customers[0], hours: '2', state });
    return res;
  };
  const closeSpring = async () => {
    const period = await t.http().post('/api/square-ups').set(bearer(tokens.owner)).send({ name: 'Spring 2025', periodFrom: '2025-03-01', periodTo: '2025-05-31' });
    expect(period.status).toBe(201);
    expect((await t.http().post(`/api/square-ups/${period.body.id}/close`).set(bearer(tokens.owner))).status).toBe(200);
  };
  const stored = async () => (await t.dbh.db.select({ n: count() }).from(workEntries).where(eq(workEntries.operationId, fx.operationId)))[0]!.n;
  return { fx, fleet, tokens, log, closeSpring, stored };
}

describe('work entries and closed square-up periods', () => {
  it('refuses a new entry dated in a closed period with a 409 naming the period, and stores nothing', async () => {
    const o = await outfit();
    await o.closeSpring();
    const late = await o.log('2025-04-10');
    expect(late.status).toBe(409);
    expect(late.body.message).toBe('2025-04-10 falls in the closed square-up "Spring 2025" (2025-03-01 to 2025-05-31); record the correction in the next period.');
    expect(await o.stored()).toBe(0);
    // The day after the period is open as before.
    expect((await o.log('2025-06-01')).status).toBe(201);
  });

  it('refuses to change, move into, submit, reopen or delete an entry of a closed period and changes nothing', async () => {
    const o = await outfit();
    const approved = (await o.log('2025-04-20')).body;
    expect((await t.http().post(`/api/work-entries/${approved.id}/approve`).set(bearer(o.tokens.partner)).send({})).status).toBe(200);
    const later = (await o.log('2025-06-10')).body;
    const pending = (await o.log('2025-06-05', 'draft')).body;
    await o.closeSpring();
    // Closing refuses while entries of the period wait, so a waiting one inside it is a row from before that rule.
    await t.dbh.db.update(workEntries).set({ workDate: '2025-04-10' }).where(eq(workEntries.id, pending.id));

    const answers = await Promise.all([
      t.http().patch(`/api/work-entries/${pending.id}`).set(bearer(o.tokens.operator)).send({ version: pending.version, notes: 'late note' }),
      t.http().patch(`/api/work-entries/${pending.id}`).set(bearer(o.tokens.operator)).send({ version: pending.version, workDate: '2025-06-02' }),
      t.http().patch(`/api/work-entries/${later.id}`).set(bearer(o.tokens.operator)).send({ version: later.version, workDate: '2025-05-30' }),
      t.http().post(`/api/work-entries/${pending.id}/submit`).set(bearer(o.tokens.operator)).send({}),
      t.http().post(`/api/work-entries/${approved.id}/reopen`).set(bearer(o.tokens.partner)).send({}),
      t.http().delete(`/api/work-entries/${pending.id}`).set(bearer(o.tokens.operator)),
    ]);
    for (const res of answers) {
      expect(res.status).toBe(409);
      expect(res.body.message).toContain('closed square-up "Spring 2025"');
    }
    const rows = await t.dbh.db.select({ id: workEntries.id, workDate: workEntries.workDate, state: workEntries.state, version: workEntries.version }).from(workEntries).where(eq(workEntries.operationId, o.fx.operationId));
    const byId = new Map(rows.map((r) => [r.id, r]));
    expect(byId.get(pending.id)).toMatchObject({ workDate: '2025-04-10', state: 'draft', version: 1 });
    expect(byId.get(later.id)).toMatchObject({ workDate: '2025-06-10', version: 1 });
    expect(byId.get(approved.id)).toMatchObject({ state: 'approved', version: 2 });

    // Outside the period nothing is held back.
    expect((await t.http().post(`/api/work-entries/${later.id}/approve`).set(bearer(o.tokens.partner)).send({})).status).toBe(200);
  });

  it('refuses imported rows dated in a closed period, naming each row, and imports nothing from the file', async () => {
    const o = await outfit();
    await o.closeSpring();
    const op = o.fx.members.operator.email;
    const [customer] = await t.dbh.db.query.parties.findMany({ where: (p, { eq: is }) => is(p.id, o.fx.customers[0]) });
    const csv = [
      'Date,Field,Work Type,Operator E-mail,Hours,Bill To',
      `2025-06-02,Home 40,Mowing (rotary),${op},3,${customer!.name}`,
      `2025-05-31,Home 40,Mowing (rotary),${op},3,${customer!.name}`,
      `3/1/2025,Creek 80,Disking,${op},5,${customer!.name}`,
    ].join('\n');
    const upload = (kind: 'entries' | 'fuel', mode: 'preview' | 'commit', body: string) =>
      t.http().post(`/api/work-entries/import?kind=${kind}&mode=${mode}`).set(bearer(o.tokens.owner)).attach('file', Buffer.from(body), { filename: 'rows.csv', contentType: 'text/csv' });
    const reason = (day: string) => `${day} falls in the closed square-up "Spring 2025" (2025-03-01 to 2025-05-31); record the correction in the next period.`;

    const preview = await upload('entries', 'preview', csv);
    expect(preview.status).toBe(200);
    expect(preview.body.errors).toEqual([
      { row: 3, column: 'date', reason: reason('2025-05-31') },
      { row: 4, column: 'date', reason: reason('2025-03-01') },
    ]);
    const commit = await upload('entries', 'commit', csv);
    expect(commit.status).toBe(400);
    expect(commit.body.created).toBe(0);
    expect(await o.stored()).toBe(0);

    // Fuel tickets are costs: the same rule holds for them.
    const fuel = await upload('fuel', 'commit', ['date,machine,gallons,amount', '2025-04-04,Red 7120,40,120.00'].join('\n'));
    expect(fuel.status).toBe(400);
    expect(fuel.body.errors).toEqual([{ row: 2, column: 'date', reason: reason('2025-04-04') }]);
  });
});
