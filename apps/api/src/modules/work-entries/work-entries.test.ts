import { randomUUID } from 'node:crypto';
import { and, count, eq } from 'drizzle-orm';
import { auditLog, meterReadings, workEntries } from '@hitchbook/db';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createOperation, signInAll, type OperationFixture } from '../../test-support/fixtures.js';
import { createTestApp, type TestApp } from '../../test-support/test-app.js';
import { addMeterReading, billEntry, createFleet, type FleetFixture } from './test-helpers.js';

let t: TestApp;
const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });

beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

/** A fresh operation with its fleet and signed-in members, so no test sees another's rows. */
async function outfit() {
  const fx = await createOperation(t.dbh.db);
  const fleet = await createFleet(t.dbh.db, fx);
  const tokens = await signInAll(t, fx);
  return { fx, fleet, tokens };
}

function entryBody(fx: OperationFixture, fleet: FleetFixture, overrides: Record<string, unknown> = {}) {
  return { workDate: '2025-06-03', fieldId: fleet.home40, workTypeId: fleet.mowing, powerMachineId: fleet.tractor, implementMachineId: fleet.cutter, billToPartyId: fx.households[0], hours: '4.5', ...overrides };
}

async function entryCount(operationId: string): Promise<number> {
  const [row] = await t.dbh.db.select({ n: count() }).from(workEntries).where(eq(workEntries.operationId, operationId));
  return row!.n;
}

describe('logging an entry', () => {
  it('logs as the operator with server defaults: acres from the field, operator hours from machine hours', async () => {
    const { fx, fleet, tokens } = await outfit();
    const res = await t.http().post('/api/work-entries').set(bearer(tokens.operator)).send(entryBody(fx, fleet, { hours: 4.25 }));
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({
      operatorUserId: fx.members.operator.userId,
      state: 'draft',
      hours: '4.25',
      operatorHours: '4.25',
      acres: '40.000',
      fieldName: 'Home 40',
      powerMachineName: 'Red 7120',
      implementMachineName: 'Batwing 15',
      workTypeName: 'Mowing (rotary)',
      version: 1,
      warnings: [],
    });
  });

  it('takes hours from the clock times and miles from a road stretch', async () => {
    const { fx, fleet, tokens } = await outfit();
    const res = await t
      .http()
      .post('/api/work-entries')
      .set(bearer(tokens.partner))
      .send(entryBody(fx, fleet, { hours: undefined, fieldId: fleet.townshipRoad, workTypeId: fleet.roadsideMowing, billToPartyId: fx.customers[1], startedAt: '2025-06-03T07:00:00-05:00', endedAt: '2025-06-03T09:45:00-05:00' }));
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ hours: '2.75', miles: '2.000', acres: '2.000', startedAt: '2025-06-03T12:00:00.000Z' });
  });

  it('refuses an operator logging as someone else and creates nothing', async () => {
    const { fx, fleet, tokens } = await outfit();
    const res = await t.http().post('/api/work-entries').set(bearer(tokens.operator)).send(entryBody(fx, fleet, { operatorUserId: fx.members.partner.userId }));
    expect(res.status).toBe(403);
    expect(res.body.issues[0].path).toBe('operatorUserId');
    expect(await entryCount(fx.operationId)).toBe(0);
  });

  it('lets a partner log for the operator but not for the bookkeeper', async () => {
    const { fx, fleet, tokens } = await outfit();
    const ok = await t.http().post('/api/work-entries').set(bearer(tokens.partner)).send(entryBody(fx, fleet, { operatorUserId: fx.members.operator.userId }));
    expect(ok.status).toBe(201);
    expect(ok.body.operatorUserId).toBe(fx.members.operator.userId);
    const bad = await t.http().post('/api/work-entries').set(bearer(tokens.partner)).send(entryBody(fx, fleet, { operatorUserId: fx.members.bookkeeper.userId }));
    expect(bad.status).toBe(400);
    expect(bad.body.issues.map((i: { path: string }) => i.path)).toEqual(['operatorUserId']);
  });

  it('returns the stored entry with 200 when the cab resends the same clientId', async () => {
    const { fx, fleet, tokens } = await outfit();
    const body = entryBody(fx, fleet, { clientId: randomUUID() });
    const first = await t.http().post('/api/work-entries').set(bearer(tokens.operator)).send(body);
    const again = await t.http().post('/api/work-entries').set(bearer(tokens.operator)).send({ ...body, hours: '9' });
    expect(first.status).toBe(201);
    expect(again.status).toBe(200);
    expect(again.body.id).toBe(first.body.id);
    expect(again.body.hours).toBe('4.50');
    expect(await entryCount(fx.operationId)).toBe(1);
  });

  it('stores one entry when the same clientId arrives twice at once', async () => {
    const { fx, fleet, tokens } = await outfit();
    const body = entryBody(fx, fleet, { clientId: randomUUID() });
    const [a, b] = await Promise.all([0, 1].map(() => t.http().post('/api/work-entries').set(bearer(tokens.operator)).send(body)));
    expect([a!.status, b!.status].sort()).toEqual([200, 201]);
    expect(a!.body.id).toBe(b!.body.id);
    expect(await entryCount(fx.operationId)).toBe(1);
  });

  it('names every bad field and refuses unknown ones', async () => {
    const { fx, fleet, tokens } = await outfit();
    const res = await t.http().post('/api/work-entries').set(bearer(tokens.owner)).send(entryBody(fx, fleet, { hours: '25', acres: '-1', workDate: '2025-02-30', price: '10' }));
    expect(res.status).toBe(400);
    expect(res.body.issues.map((i: { path: string }) => i.path).sort()).toEqual(['acres', 'hours', 'price', 'workDate']);
  });

  it('refuses an archived field, an implement as the power unit and a tractor as the implement, all at once', async () => {
    const { fx, fleet, tokens } = await outfit();
    const res = await t.http().post('/api/work-entries').set(bearer(tokens.owner)).send(entryBody(fx, fleet, { fieldId: fleet.oldPasture, powerMachineId: fleet.disk, implementMachineId: fleet.tractor }));
    expect(res.status).toBe(400);
    expect(res.body.issues.map((i: { path: string }) => i.path).sort()).toEqual(['fieldId', 'implementMachineId', 'powerMachineId']);
    expect(await entryCount(fx.operationId)).toBe(0);
  });
});

describe('tenant isolation', () => {
  it("refuses another operation's field, machines, work type and bill-to party, naming each, and creates nothing", async () => {
    const mine = await outfit();
    const theirs = await outfit();
    const res = await t
      .http()
      .post('/api/work-entries')
      .set(bearer(mine.tokens.owner))
      .send(
        entryBody(mine.fx, mine.fleet, {
          fieldId: theirs.fleet.home40,
          workTypeId: theirs.fleet.mowing,
          powerMachineId: theirs.fleet.tractor,
          implementMachineId: theirs.fleet.cutter,
          billToPartyId: theirs.fx.customers[0],
          operatorUserId: theirs.fx.members.operator.userId,
        }),
      );
    expect(res.status).toBe(400);
    expect(res.body.issues.map((i: { path: string }) => i.path).sort()).toEqual(['billToPartyId', 'fieldId', 'implementMachineId', 'operatorUserId', 'powerMachineId', 'workTypeId']);
    expect(await entryCount(mine.fx.operationId)).toBe(0);
    expect(await entryCount(theirs.fx.operationId)).toBe(0);
  });

  it("answers 404 for another operation's entry in every route and changes nothing", async () => {
    const mine = await outfit();
    const theirs = await outfit();
    const foreign = (await t.http().post('/api/work-entries').set(bearer(theirs.tokens.owner)).send(entryBody(theirs.fx, theirs.fleet, { state: 'submitted' }))).body;
    const as = bearer(mine.tokens.owner);
    expect((await t.http().get(`/api/work-entries/${foreign.id}`).set(as)).status).toBe(404);
    expect((await t.http().patch(`/api/work-entries/${foreign.id}`).set(as).send({ version: 1, notes: 'taken' })).status).toBe(404);
    expect((await t.http().post(`/api/work-entries/${foreign.id}/approve`).set(as).send({})).status).toBe(404);
    expect((await t.http().delete(`/api/work-entries/${foreign.id}`).set(as)).status).toBe(404);
    const [row] = await t.dbh.db.select().from(workEntries).where(eq(workEntries.id, foreign.id));
    expect(row).toMatchObject({ state: 'submitted', notes: null, version: 1 });
  });
});

describe('states', () => {
  it('goes draft → submitted → approved → reopened, with only owners and partners approving, and audits the change of an approved entry', async () => {
    const { fx, fleet, tokens } = await outfit();
    const created = (await t.http().post('/api/work-entries').set(bearer(tokens.operator)).send(entryBody(fx, fleet))).body;
    const submitted = await t.http().post(`/api/work-entries/${created.id}/submit`).set(bearer(tokens.operator)).send({ version: 1 });
    expect(submitted.status).toBe(200);
    expect(submitted.body).toMatchObject({ state: 'submitted', version: 2 });

    expect((await t.http().post(`/api/work-entries/${created.id}/approve`).set(bearer(tokens.operator)).send({})).status).toBe(403);
    expect((await t.http().post(`/api/work-entries/${created.id}/approve`).set(bearer(tokens.bookkeeper)).send({})).status).toBe(403);
    const approved = await t.http().post(`/api/work-entries/${created.id}/approve`).set(bearer(tokens.partner)).send({});
    expect(approved.body).toMatchObject({ state: 'approved', version: 3 });
    expect(approved.body.approvedAt).not.toBeNull();

    const blocked = await t.http().patch(`/api/work-entries/${created.id}`).set(bearer(tokens.owner)).send({ version: 3, hours: '5' });
    expect(blocked.status).toBe(409);
    expect(blocked.body.message).toContain('reopen');
    expect((await t.http().patch(`/api/work-entries/${created.id}`).set(bearer(tokens.operator)).send({ version: 3, hours: '5' })).status).toBe(409);

    const reopened = await t.http().post(`/api/work-entries/${created.id}/reopen`).set(bearer(tokens.owner)).send({ version: 3 });
    expect(reopened.body).toMatchObject({ state: 'submitted', version: 4, approvedAt: null });
    const changed = await t.http().patch(`/api/work-entries/${created.id}`).set(bearer(tokens.owner)).send({ version: 4, hours: '5' });
    expect(changed.status).toBe(200);
    expect(changed.body).toMatchObject({ hours: '5.00', operatorHours: '5.00', version: 5 });

    const trail = await t.dbh.db.select().from(auditLog).where(and(eq(auditLog.entityType, 'work-entry'), eq(auditLog.entityId, created.id))).orderBy(auditLog.createdAt);
    expect(trail.map((a) => a.action)).toEqual(['work-entry.created', 'work-entry.submitted', 'work-entry.approved', 'work-entry.reopened', 'work-entry.updated']);
    const reopen = trail[3]!;
    expect((reopen.before as { state: string }).state).toBe('approved');
    expect((reopen.after as { state: string }).state).toBe('submitted');
    const update = trail[4]!;
    expect((update.before as { hours: string }).hours).toBe('4.50');
    expect((update.after as { hours: string }).hours).toBe('5.00');
    expect(update.actorUserId).toBe(fx.members.owner.userId);
  });

  it('refuses approving a draft and submitting twice', async () => {
    const { fx, fleet, tokens } = await outfit();
    const created = (await t.http().post('/api/work-entries').set(bearer(tokens.owner)).send(entryBody(fx, fleet))).body;
    expect((await t.http().post(`/api/work-entries/${created.id}/approve`).set(bearer(tokens.owner)).send({})).status).toBe(409);
    expect((await t.http().post(`/api/work-entries/${created.id}/submit`).set(bearer(tokens.owner)).send({})).status).toBe(200);
    expect((await t.http().post(`/api/work-entries/${created.id}/submit`).set(bearer(tokens.owner)).send({})).status).toBe(409);
  });

  it('never changes an invoiced entry: no edit, no reopen, no delete', async () => {
    const { fx, fleet, tokens } = await outfit();
    const created = (await t.http().post('/api/work-entries').set(bearer(tokens.owner)).send(entryBody(fx, fleet, { state: 'submitted', billToPartyId: fx.customers[0] }))).body;
    await t.http().post(`/api/work-entries/${created.id}/approve`).set(bearer(tokens.owner)).send({});
    await billEntry(t.dbh.db, fx.operationId, fx.customers[0], created.id);
    const reopen = await t.http().post(`/api/work-entries/${created.id}/reopen`).set(bearer(tokens.owner)).send({});
    expect(reopen.status).toBe(409);
    expect(reopen.body.message).toContain('invoice');
    expect((await t.http().patch(`/api/work-entries/${created.id}`).set(bearer(tokens.owner)).send({ version: 2, hours: '1' })).status).toBe(409);
    expect((await t.http().delete(`/api/work-entries/${created.id}`).set(bearer(tokens.owner))).status).toBe(409);
    const [row] = await t.dbh.db.select().from(workEntries).where(eq(workEntries.id, created.id));
    expect(row).toMatchObject({ state: 'approved', hours: '4.50', version: 2 });
  });

  it('refuses a change made against a stale version with 409 and keeps the first change', async () => {
    const { fx, fleet, tokens } = await outfit();
    const created = (await t.http().post('/api/work-entries').set(bearer(tokens.operator)).send(entryBody(fx, fleet))).body;
    expect((await t.http().patch(`/api/work-entries/${created.id}`).set(bearer(tokens.operator)).send({ version: 1, notes: 'gate left open' })).status).toBe(200);
    const stale = await t.http().patch(`/api/work-entries/${created.id}`).set(bearer(tokens.owner)).send({ version: 1, notes: 'overwritten' });
    expect(stale.status).toBe(409);
    expect(stale.body.message).toContain('version 1, now 2');
    const [row] = await t.dbh.db.select().from(workEntries).where(eq(workEntries.id, created.id));
    expect(row!.notes).toBe('gate left open');
  });

  it('deletes a draft only', async () => {
    const { fx, fleet, tokens } = await outfit();
    const draft = (await t.http().post('/api/work-entries').set(bearer(tokens.operator)).send(entryBody(fx, fleet))).body;
    const submitted = (await t.http().post('/api/work-entries').set(bearer(tokens.operator)).send(entryBody(fx, fleet, { state: 'submitted' }))).body;
    expect((await t.http().delete(`/api/work-entries/${submitted.id}`).set(bearer(tokens.operator))).status).toBe(409);
    expect((await t.http().delete(`/api/work-entries/${draft.id}`).set(bearer(tokens.operator))).status).toBe(204);
    expect((await t.http().get(`/api/work-entries/${draft.id}`).set(bearer(tokens.owner))).status).toBe(404);
    expect(await entryCount(fx.operationId)).toBe(1);
  });
});

describe('who sees and changes what', () => {
  it("keeps an operator to their own entries: someone else's is 404 to read, change or delete", async () => {
    const { fx, fleet, tokens } = await outfit();
    const partners = (await t.http().post('/api/work-entries').set(bearer(tokens.partner)).send(entryBody(fx, fleet))).body;
    expect((await t.http().get(`/api/work-entries/${partners.id}`).set(bearer(tokens.operator))).status).toBe(404);
    expect((await t.http().patch(`/api/work-entries/${partners.id}`).set(bearer(tokens.operator)).send({ version: 1, hours: '1' })).status).toBe(404);
    expect((await t.http().post(`/api/work-entries/${partners.id}/submit`).set(bearer(tokens.operator)).send({})).status).toBe(404);
    expect((await t.http().delete(`/api/work-entries/${partners.id}`).set(bearer(tokens.operator))).status).toBe(404);
    expect((await t.http().get(`/api/work-entries/${partners.id}`).set(bearer(tokens.bookkeeper))).status).toBe(200);
  });

  it('lets the bookkeeper read but change nothing, and keeps customers out', async () => {
    const { fx, fleet, tokens } = await outfit();
    const entry = (await t.http().post('/api/work-entries').set(bearer(tokens.owner)).send(entryBody(fx, fleet, { state: 'submitted' }))).body;
    expect((await t.http().post('/api/work-entries').set(bearer(tokens.bookkeeper)).send(entryBody(fx, fleet))).status).toBe(403);
    expect((await t.http().patch(`/api/work-entries/${entry.id}`).set(bearer(tokens.bookkeeper)).send({ version: 2, hours: '1' })).status).toBe(403);
    expect((await t.http().post(`/api/work-entries/${entry.id}/approve`).set(bearer(tokens.bookkeeper)).send({})).status).toBe(403);
    expect((await t.http().delete(`/api/work-entries/${entry.id}`).set(bearer(tokens.bookkeeper))).status).toBe(403);
    for (const customer of [tokens.customer, tokens.customer2]) {
      expect((await t.http().get(`/api/work-entries/${entry.id}`).set(bearer(customer))).status).toBe(403);
      expect((await t.http().post('/api/work-entries').set(bearer(customer)).send(entryBody(fx, fleet))).status).toBe(403);
    }
    const [row] = await t.dbh.db.select().from(workEntries).where(eq(workEntries.id, entry.id));
    expect(row).toMatchObject({ state: 'submitted', hours: '4.50' });
  });
});

describe('hour meter', () => {
  it('starts from the machine’s last reading, records the meter end as a reading, and moves it on change', async () => {
    const { fx, fleet, tokens } = await outfit();
    await addMeterReading(t.dbh.db, fx.operationId, fleet.tractor, '2025-06-01T18:00:00Z', '1250.0');
    const res = await t.http().post('/api/work-entries').set(bearer(tokens.operator)).send(entryBody(fx, fleet, { hours: undefined, meterEnd: '1253.5' }));
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ meterStart: '1250.0', meterEnd: '1253.5', hours: '3.50' });
    const fix = await t.http().patch(`/api/work-entries/${res.body.id}`).set(bearer(tokens.operator)).send({ version: 1, meterEnd: '1254.0' });
    expect(fix.body).toMatchObject({ meterEnd: '1254.0', hours: '4.00' });
    const readings = await t.dbh.db.select().from(meterReadings).where(eq(meterReadings.machineId, fleet.tractor)).orderBy(meterReadings.readAt);
    expect(readings.map((r) => [r.hours, r.source])).toEqual([
      ['1250.0', 'manual'],
      ['1254.0', 'work-entry'],
    ]);
    expect(readings[1]!.workEntryId).toBe(res.body.id);
  });

  it('refuses a meter end below the latest reading, naming both, and stores nothing', async () => {
    const { fx, fleet, tokens } = await outfit();
    await addMeterReading(t.dbh.db, fx.operationId, fleet.tractor, '2025-06-01T18:00:00Z', '1250.0');
    const res = await t.http().post('/api/work-entries').set(bearer(tokens.operator)).send(entryBody(fx, fleet, { meterStart: '1238.0', meterEnd: '1240.0' }));
    expect(res.status).toBe(400);
    expect(res.body.issues).toHaveLength(1);
    expect(res.body.issues[0].path).toBe('meterEnd');
    expect(res.body.issues[0].message).toContain('1240.0');
    expect(res.body.issues[0].message).toContain('1250.0 h read at 2025-06-01');
    expect(await entryCount(fx.operationId)).toBe(0);
  });

  it('refuses a back-dated meter end above a later reading', async () => {
    const { fx, fleet, tokens } = await outfit();
    await addMeterReading(t.dbh.db, fx.operationId, fleet.tractor, '2025-06-10T18:00:00Z', '1300.0');
    const res = await t.http().post('/api/work-entries').set(bearer(tokens.owner)).send(entryBody(fx, fleet, { meterStart: '1305.0', meterEnd: '1307.0' }));
    expect(res.status).toBe(400);
    expect(res.body.issues[0].message).toContain('1300.0 h read later, at 2025-06-10');
  });

  it('asks for the meter start when the machine has never been read', async () => {
    const { fx, fleet, tokens } = await outfit();
    const res = await t.http().post('/api/work-entries').set(bearer(tokens.owner)).send(entryBody(fx, fleet, { hours: undefined, meterEnd: '10.0' }));
    expect(res.status).toBe(400);
    expect(res.body.issues.map((i: { path: string }) => i.path)).toEqual(['meterStart']);
  });

  it('drops the meter reading with a deleted draft', async () => {
    const { fx, fleet, tokens } = await outfit();
    const res = await t.http().post('/api/work-entries').set(bearer(tokens.owner)).send(entryBody(fx, fleet, { hours: undefined, meterStart: '10.0', meterEnd: '12.0' }));
    await t.http().delete(`/api/work-entries/${res.body.id}`).set(bearer(tokens.owner));
    const readings = await t.dbh.db.select().from(meterReadings).where(eq(meterReadings.machineId, fleet.tractor));
    expect(readings).toEqual([]);
  });
});

describe('plausibility warnings', () => {
  it('warns when acres per hour exceed the cutter’s field capacity: 15 ft × 7 mph × 0.80 / 8.25 = 10.2 ac/h (Iowa State AgDM A3-24)', async () => {
    const { fx, fleet, tokens } = await outfit();
    const fast = await t.http().post('/api/work-entries').set(bearer(tokens.operator)).send(entryBody(fx, fleet, { hours: '2', acres: '40' }));
    expect(fast.status).toBe(201);
    expect(fast.body.warnings.map((w: { code: string }) => w.code)).toEqual(['above-field-capacity']);
    expect(fast.body.warnings[0].message).toContain('10.2 ac/h');
    const plausible = await t.http().post('/api/work-entries').set(bearer(tokens.operator)).send(entryBody(fx, fleet, { workDate: '2025-06-04', hours: '4', acres: '40' }));
    expect(plausible.body.warnings).toEqual([]);
    expect((await t.http().get(`/api/work-entries/${fast.body.id}`).set(bearer(tokens.partner))).body.warnings[0].code).toBe('above-field-capacity');
  });

  it('uses the machine’s own speed and efficiency when it has them', async () => {
    const { fx, fleet, tokens } = await outfit();
    const { machines } = await import('@hitchbook/db');
    await t.dbh.db.update(machines).set({ speedMph: '12', fieldEfficiencyPct: '85' }).where(eq(machines.id, fleet.cutter));
    // 15 × 12 × 0.85 / 8.25 = 18.5 ac/h, so 36 acres in 2 h is plausible for this cutter.
    const res = await t.http().post('/api/work-entries').set(bearer(tokens.operator)).send(entryBody(fx, fleet, { hours: '2', acres: '36' }));
    expect(res.body.warnings).toEqual([]);
  });

  it('warns about clock overlaps and meter gaps on the same machine that day, on both entries', async () => {
    const { fx, fleet, tokens } = await outfit();
    const morning = (
      await t
        .http()
        .post('/api/work-entries')
        .set(bearer(tokens.operator))
        .send(entryBody(fx, fleet, { hours: undefined, acres: '20', meterStart: '100.0', meterEnd: '102.0', startedAt: '2025-06-03T08:00:00-05:00', endedAt: '2025-06-03T10:00:00-05:00' }))
    ).body;
    const noon = await t
      .http()
      .post('/api/work-entries')
      .set(bearer(tokens.operator))
      .send(entryBody(fx, fleet, { fieldId: fleet.creek80, hours: undefined, acres: '20', meterStart: '103.0', meterEnd: '105.0', startedAt: '2025-06-03T09:30:00-05:00', endedAt: '2025-06-03T11:30:00-05:00' }));
    expect(noon.body.warnings.map((w: { code: string }) => w.code).sort()).toEqual(['clock-overlap', 'meter-gap']);
    expect(noon.body.warnings.find((w: { code: string }) => w.code === 'meter-gap').message).toContain('1.0 h (102.0 to 103.0) after Home 40');
    const again = await t.http().get(`/api/work-entries/${morning.id}`).set(bearer(tokens.operator));
    expect(again.body.warnings.map((w: { code: string }) => w.code).sort()).toEqual(['clock-overlap', 'meter-gap']);
  });

  it('warns about an entry longer than 16 hours but stores it', async () => {
    const { fx, fleet, tokens } = await outfit();
    const res = await t.http().post('/api/work-entries').set(bearer(tokens.operator)).send(entryBody(fx, fleet, { hours: '17', acres: '40' }));
    expect(res.status).toBe(201);
    expect(res.body.warnings.map((w: { code: string }) => w.code)).toEqual(['long-entry']);
  });
});
