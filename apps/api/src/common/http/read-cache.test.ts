import { workEntries } from '@hitchbook/db';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { conflict } from '../errors/app-error.js';
import { WorkEntriesService } from '../../modules/work-entries/work-entries.service.js';
import { createOperation, signIn, signInAll, type OperationFixture } from '../../test-support/fixtures.js';
import { SessionService } from '../../modules/auth/session.service.js';
import { AuthGuard } from '../auth/auth.guard.js';
import { createTestApp, type TestApp } from '../../test-support/test-app.js';
import { createFleet, type FleetFixture } from '../../modules/work-entries/test-helpers.js';

let t: TestApp;
let fx: OperationFixture;
let other: OperationFixture;
let fleet: FleetFixture;
let tokens: Awaited<ReturnType<typeof signInAll>>;
let otherTokens: Awaited<ReturnType<typeof signInAll>>;
const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });
const LIST = '/api/work-entries?dateFrom=2025-01-01&dateTo=2025-12-31&sort=-date&pageSize=50';

beforeAll(async () => {
  t = await createTestApp();
  fx = await createOperation(t.dbh.db, 'Kept answers');
  other = await createOperation(t.dbh.db, 'Kept answers, next door');
  fleet = await createFleet(t.dbh.db, fx);
  tokens = await signInAll(t, fx);
  otherTokens = await signInAll(t, other);
  await addEntry('3.00');
});
afterAll(() => t.close());

async function addEntry(hours: string): Promise<void> {
  await t.dbh.db.insert(workEntries).values(entryRow(hours));
}

function entryRow(hours: string) {
  return {
    operationId: fx.operationId,
    createdBy: fx.members.owner.userId,
    workDate: '2025-05-01',
    fieldId: fleet.home40,
    workTypeId: fleet.mowing,
    powerMachineId: fleet.tractor,
    operatorUserId: fx.members.operator.userId,
    hours,
    acres: '10.000',
    billToPartyId: fx.households[0],
    state: 'approved' as const,
  };
}

/** Writes an entry with the database's triggers switched off, so the operation's data version stays where it was. */
async function addEntryUnversioned(hours: string): Promise<void> {
  const client = await t.dbh.pool.connect();
  try {
    await client.query('set session_replication_role = replica');
    const row = entryRow(hours);
    await client.query(
      `insert into work_entries (operation_id, created_by, work_date, field_id, work_type_id, power_machine_id, operator_user_id, hours, acres, bill_to_party_id, state)
       values ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11)`,
      [row.operationId, row.createdBy, row.workDate, row.fieldId, row.workTypeId, row.powerMachineId, row.operatorUserId, row.hours, row.acres, row.billToPartyId, row.state],
    );
  } finally {
    await client.query('reset session_replication_role');
    client.release();
  }
}

async function totalHours(token = tokens.bookkeeper, headers: Record<string, string> = {}): Promise<string> {
  const res = await t.http().get(LIST).set({ ...bearer(token), ...headers });
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  expect(res.headers['content-type']).toMatch(/^application\/json/);
  return (res.body as { totals: { hours: string } }).totals.hours;
}

describe('answers kept until the data changes', () => {
  it('serves a kept answer while nothing is written, and a fresh one when asked with no-cache', async () => {
    const before = await totalHours();
    await addEntryUnversioned('1.25');
    // The version did not move, so the kept answer is served: it is really kept.
    expect(await totalHours()).toBe(before);
    expect(await totalHours(tokens.bookkeeper, { 'Cache-Control': 'no-cache' })).toBe((Number(before) + 1.25).toFixed(2));
    // The fresh answer replaced the kept one.
    expect(await totalHours()).toBe((Number(before) + 1.25).toFixed(2));
  });

  it('answers anew after any committed write to the operation, through the API or not', async () => {
    const before = Number(await totalHours());
    await addEntry('2.00');
    expect(await totalHours()).toBe((before + 2).toFixed(2));

    const res = await t
      .http()
      .post('/api/work-entries')
      .set(bearer(tokens.owner))
      .send({ workDate: '2025-05-03', fieldId: fleet.home40, workTypeId: fleet.mowing, powerMachineId: fleet.tractor, hours: '0.50', acres: '5.000', billToPartyId: fx.households[0], state: 'draft' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(await totalHours()).toBe((before + 2.5).toFixed(2));
  });

  it("keeps each member's answer apart, and another operation's writes do not touch this one's", async () => {
    const mine = await totalHours(tokens.bookkeeper);
    // The same URL for the other operation's bookkeeper is answered from that operation's rows.
    expect(await totalHours(otherTokens.bookkeeper)).toBe('0.00');
    await addEntryUnversioned('4.00');
    // A write in the other operation moves only its version: this operation's kept answer still stands.
    await t.dbh.pool.query("insert into parties (operation_id, kind, name, relationship) values ($1, 'household', 'Household next door', 'family')", [other.operationId]);
    expect(await totalHours(tokens.bookkeeper)).toBe(mine);
    // Another member of this operation has an answer of its own, computed now.
    expect(await totalHours(tokens.partner)).toBe((Number(mine) + 4).toFixed(2));
  });

  it('asks for the membership afresh on every request, kept answer or not', async () => {
    await totalHours(tokens.operator);
    await t.dbh.pool.query("update memberships set status = 'invited' where id = $1", [fx.members.operator.membershipId]);
    const res = await t.http().get(LIST).set(bearer(tokens.operator));
    expect(res.status).toBe(401);
    await t.dbh.pool.query("update memberships set status = 'active' where id = $1", [fx.members.operator.membershipId]);
    expect(Number(await totalHours(tokens.operator))).toBeGreaterThan(0);
  });

  it('keeps nothing for a request that fails validation', async () => {
    const bad = await t.http().get('/api/work-entries?pageSize=5000').set(bearer(tokens.bookkeeper));
    expect(bad.status).toBe(400);
    const again = await t.http().get('/api/work-entries?pageSize=5000').set(bearer(tokens.bookkeeper));
    expect(again.status).toBe(400);
  });

  it('sends a kept answer gzipped to a client that accepts gzip, and as plain JSON to one that does not', async () => {
    await addEntry('1.50');
    const ask = (encoding: string) =>
      t
        .http()
        .get(LIST)
        .set({ ...bearer(tokens.bookkeeper), 'Accept-Encoding': encoding });
    const plain = await ask('identity');
    expect(plain.status).toBe(200);
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(plain.headers.vary).toMatch(/Accept-Encoding/);
    expect(Number(plain.headers['content-length'])).toBe(Buffer.byteLength(plain.text));
    expect(plain.text.length).toBeGreaterThanOrEqual(1024);

    // Computed once, then kept: both answers arrive gzipped (Content-Length counts the bytes sent) and the test
    // client's gunzip gives back the same JSON.
    for (const encoding of ['gzip, deflate, br', 'br;q=1, gzip;q=0.5']) {
      const zipped = await ask(encoding);
      expect(zipped.status).toBe(200);
      expect(zipped.headers['content-encoding']).toBe('gzip');
      expect(zipped.headers['content-type']).toMatch(/^application\/json/);
      expect(Number(zipped.headers['content-length'])).toBeLessThan(plain.text.length / 2);
      expect(zipped.text).toBe(plain.text);
    }
    // A client that refuses gzip outright gets the JSON itself.
    const refused = await ask('gzip;q=0');
    expect(refused.headers['content-encoding']).toBeUndefined();
    expect(refused.text).toBe(plain.text);
  });

  describe('a kept answer, sent before the request reaches the router', () => {
    it('comes with the headers every API answer has, and reads the member once per request, kept or computed', async () => {
      const sessions = t.app.get(SessionService);
      const lookups = vi.spyOn(sessions, 'actorFromAccessToken');
      const list = vi.spyOn(t.app.get(WorkEntriesService), 'list');
      const guarded = vi.spyOn(AuthGuard.prototype, 'canActivate');
      try {
        await totalHours(tokens.bookkeeper, { 'Cache-Control': 'no-cache' });
        expect([lookups.mock.calls.length, guarded.mock.calls.length, list.mock.calls.length]).toEqual([1, 1, 1]);
        const kept = await t.http().get(LIST).set(bearer(tokens.bookkeeper));
        expect(kept.status).toBe(200);
        // The member was read again, and the answer sent without the router's guard running.
        expect([lookups.mock.calls.length, guarded.mock.calls.length, list.mock.calls.length]).toEqual([2, 1, 1]);
        expect(kept.headers['cache-control']).toBe('no-store');
        expect(kept.headers['x-request-id']).toMatch(/^[0-9a-f-]{36}$/);
        expect(kept.headers['x-content-type-options']).toBe('nosniff');
        expect(kept.headers['content-type']).toMatch(/^application\/json; charset=utf-8/);
      } finally {
        lookups.mockRestore();
        list.mockRestore();
        guarded.mockRestore();
      }
    });

    it('is refused to a session signed out since, though its member and the data are unchanged', async () => {
      const { token } = await signIn(t, fx.members.bookkeeper.email);
      await totalHours(token);
      const sessionId = (JSON.parse(Buffer.from(token.split('.')[1]!, 'base64url').toString()) as { sid: string }).sid;
      await t.dbh.pool.query('update auth_sessions set revoked_at = now() where id = $1', [sessionId]);
      const res = await t.http().get(LIST).set(bearer(token));
      expect(res.status).toBe(401);
      // The member's other session still gets the kept answer.
      expect(Number(await totalHours(tokens.bookkeeper))).toBeGreaterThan(0);
    });

    it('is never kept for a request the route refuses', async () => {
      for (let i = 0; i < 2; i++) {
        const res = await t.http().get(LIST).set(bearer(tokens.customer));
        expect(res.status).toBe(403);
      }
      const forged = await t.http().get(LIST).set(bearer(`${tokens.bookkeeper}x`));
      expect(forged.status).toBe(401);
    });
  });

  describe('requests that meet while an answer is computed', () => {
    /** Counts the list's computations, each held back a moment so that the requests overlap. */
    function slowList() {
      const service = t.app.get(WorkEntriesService);
      const original = service.list.bind(service);
      return vi.spyOn(service, 'list').mockImplementation(async (...args) => {
        await new Promise((resolve) => setTimeout(resolve, 150));
        return original(...args);
      });
    }

    it('computes the answer once for all of them, and each gets it whole', async () => {
      await addEntry('1.00');
      const list = slowList();
      try {
        const answers = await Promise.all(Array.from({ length: 8 }, () => t.http().get(LIST).set(bearer(tokens.bookkeeper))));
        expect(answers.map((a) => a.status)).toEqual(Array(8).fill(200));
        expect(new Set(answers.map((a) => a.text)).size).toBe(1);
        expect(answers[0]!.body.items.length).toBeGreaterThan(0);
        expect(list).toHaveBeenCalledTimes(1);
      } finally {
        list.mockRestore();
      }
    });

    it('computes afresh for each request sent with no-cache', async () => {
      const list = slowList();
      try {
        const answers = await Promise.all(Array.from({ length: 3 }, () => t.http().get(LIST).set(bearer(tokens.bookkeeper)).set('Cache-Control', 'no-cache')));
        expect(answers.map((a) => a.status)).toEqual([200, 200, 200]);
        expect(list).toHaveBeenCalledTimes(3);
      } finally {
        list.mockRestore();
      }
    });

    it('hands a failure to every request that waited for it and keeps nothing', async () => {
      await addEntry('1.00');
      const service = t.app.get(WorkEntriesService);
      const list = vi.spyOn(service, 'list').mockImplementationOnce(async () => {
        await new Promise((resolve) => setTimeout(resolve, 150));
        throw conflict('The entries changed while they were read; try again.');
      });
      try {
        const answers = await Promise.all(Array.from({ length: 4 }, () => t.http().get(LIST).set(bearer(tokens.bookkeeper))));
        expect(answers.map((a) => [a.status, a.body.message])).toEqual(Array(4).fill([409, 'The entries changed while they were read; try again.']));
        expect(list).toHaveBeenCalledTimes(1);
        // Nothing was kept: the next request computes the answer.
        const next = await t.http().get(LIST).set(bearer(tokens.bookkeeper));
        expect(next.status).toBe(200);
        expect(list).toHaveBeenCalledTimes(2);
      } finally {
        list.mockRestore();
      }
    });
  });
});
