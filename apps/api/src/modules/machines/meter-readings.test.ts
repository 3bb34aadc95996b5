import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { fields, workEntries } from '@hitchbook/db';
import { createOperation, signInAll, type OperationFixture } from '../../test-support/fixtures.js';
import { createTestApp, type TestApp } from '../../test-support/test-app.js';
import { MachineUsageRepository } from './machine-usage.repository.js';

let t: TestApp;
let fx: OperationFixture;
let tokens: Awaited<ReturnType<typeof signInAll>>;
const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });

beforeAll(async () => {
  t = await createTestApp();
  fx = await createOperation(t.dbh.db);
  tokens = await signInAll(t, fx);
});
afterAll(() => t.close());

async function newTractor(): Promise<string> {
  const res = await t.http().post('/api/machines').set(bearer(tokens.owner)).send({ name: `Tractor ${Math.random()}`, classId: 'tractor-2wd', ptoHp: 95 });
  return res.body.id as string;
}
const read = (machineId: string, body: Record<string, unknown>, token = tokens.operator) => t.http().post(`/api/machines/${machineId}/meter-readings`).set(bearer(token)).send(body);

describe('hour-meter readings', () => {
  it('refuses a reading lower than the one before, naming both values and both times', async () => {
    const id = await newTractor();
    expect((await read(id, { readAt: '2025-04-01T07:00:00Z', hours: '1204.5' })).status).toBe(201);
    const lower = await read(id, { readAt: '2025-04-08T18:30:00Z', hours: 1180 });
    expect(lower.status).toBe(400);
    expect(lower.body.issues[0].path).toBe('hours');
    expect(lower.body.issues[0].message).toBe(
      '1180.0 h at 2025-04-08 18:30 UTC is lower than the 1204.5 h read at 2025-04-01 07:00 UTC. A meter cannot run backwards; if it was replaced, record a reset.',
    );
    expect((await read(id, { readAt: '2025-04-08T18:30:00Z', hours: '1204.5' })).status).toBe(201);
  });

  it('checks a late-entered reading against the readings on either side of it', async () => {
    const id = await newTractor();
    await read(id, { readAt: '2025-05-01T12:00:00Z', hours: 500 });
    await read(id, { readAt: '2025-05-20T12:00:00Z', hours: 540 });
    const tooHigh = await read(id, { readAt: '2025-05-10T12:00:00Z', hours: 545 });
    expect(tooHigh.status).toBe(400);
    expect(tooHigh.body.issues[0].message).toMatch(/545\.0 h at 2025-05-10 12:00 UTC is higher than the 540\.0 h read later, at 2025-05-20 12:00 UTC/);
    expect((await read(id, { readAt: '2025-05-10T12:00:00Z', hours: 520 })).status).toBe(201);
  });

  it('records a replaced meter as a reset with its offset, carrying the machine total across', async () => {
    const id = await newTractor();
    await read(id, { readAt: '2025-03-01T08:00:00Z', hours: '4210.4' });
    const reset = await read(id, { readAt: '2025-03-05T08:00:00Z', hours: 0, kind: 'reset', offsetHours: '4212' }, tokens.partner);
    expect(reset.status).toBe(201);
    expect(reset.body).toMatchObject({ kind: 'reset', hours: '0.0', offsetHours: '4212.0', totalHours: '4212.0' });
    const after = await read(id, { readAt: '2025-03-09T08:00:00Z', hours: '12.5' });
    expect(after.status).toBe(201);
    expect(after.body).toMatchObject({ kind: 'reading', hours: '12.5', offsetHours: '4212.0', totalHours: '4224.5' });
    const list = await t.http().get(`/api/machines/${id}/meter-readings`).set(bearer(tokens.bookkeeper));
    expect(list.body.items.map((r: { totalHours: string }) => r.totalHours)).toEqual(['4224.5', '4212.0', '4210.4']);
  });

  it('defaults a reset’s offset to the last total and refuses one below it or before a later reading', async () => {
    const id = await newTractor();
    await read(id, { readAt: '2025-06-01T08:00:00Z', hours: 800 });
    const low = await read(id, { readAt: '2025-06-02T08:00:00Z', hours: 0, kind: 'reset', offsetHours: 700 });
    expect(low.status).toBe(400);
    expect(low.body.issues[0]).toMatchObject({ path: 'offsetHours', message: expect.stringMatching(/700\.0 h is below the 800\.0 h the machine had at 2025-06-01 08:00 UTC/) });
    const early = await read(id, { readAt: '2025-05-01T08:00:00Z', hours: 0, kind: 'reset' });
    expect(early.status).toBe(400);
    expect(early.body.issues[0].path).toBe('readAt');
    const defaulted = await read(id, { readAt: '2025-06-02T08:00:00Z', hours: 3, kind: 'reset' });
    expect(defaulted.body).toMatchObject({ offsetHours: '800.0', totalHours: '803.0' });
  });

  it('refuses future readings, offsets on plain readings and unknown fields', async () => {
    const id = await newTractor();
    const res = await read(id, { readAt: new Date(Date.now() + 86_400_000).toISOString(), hours: 1, offsetHours: 3, odometer: 9 });
    expect(res.status).toBe(400);
    expect(res.body.issues.map((i: { path: string }) => i.path).sort()).toEqual(['odometer', 'offsetHours', 'readAt']);
  });

  it('lets operators record readings, but not the bookkeeper or a customer', async () => {
    const id = await newTractor();
    expect((await read(id, { hours: 10 }, tokens.bookkeeper)).status).toBe(403);
    expect((await read(id, { hours: 10 }, tokens.customer)).status).toBe(403);
    expect((await read(id, { hours: 10 }, tokens.operator)).status).toBe(201);
  });

  it('gives a machine’s hours in a period from readings across a reset and from work entries', async () => {
    const id = await newTractor();
    await read(id, { readAt: '2024-12-28T12:00:00Z', hours: 1000 });
    await read(id, { readAt: '2025-04-01T12:00:00Z', hours: 1100 });
    await read(id, { readAt: '2025-07-01T12:00:00Z', hours: 20, kind: 'reset', offsetHours: 1150 });
    await read(id, { readAt: '2025-12-30T12:00:00Z', hours: 120 });
    await read(id, { readAt: '2026-01-03T12:00:00Z', hours: 125 });
    const [field] = await t.dbh.db.insert(fields).values({ operationId: fx.operationId, name: 'Usage field', acres: '40' }).returning();
    const workType = await t.dbh.db.query.workTypes.findFirst({ where: (w, { and, eq }) => and(eq(w.operationId, fx.operationId), eq(w.key, 'disking')) });
    const entry = (workDate: string, hours: string, state: 'draft' | 'submitted' | 'approved') => ({
      operationId: fx.operationId, workDate, operatorUserId: fx.members.operator.userId, fieldId: field!.id, workTypeId: workType!.id,
      powerMachineId: id, hours, acres: '40', billToPartyId: fx.households[0], state,
    });
    await t.dbh.db.insert(workEntries).values([entry('2025-05-02', '6.5', 'approved'), entry('2025-05-03', '4', 'submitted'), entry('2025-05-04', '9', 'draft'), entry('2026-01-02', '5', 'approved')]);

    const usage = t.app.get(MachineUsageRepository);
    // Meter: the baseline is the last reading before 2025 (1,000.0 total); the end is the last reading in
    // 2025, 1,150.0 + 120.0 = 1,270.0 total, so 270.0 hours. Entries: 6.5 + 4 = 10.5 (the draft does not count).
    const year = await usage.hoursInPeriod(fx.operationId, id, '2025-01-01', '2025-12-31');
    expect(year.meterHours?.toFixed(1)).toBe('270.0');
    expect(year.entryHours.toFixed(2)).toBe('10.50');
    expect(year).toMatchObject({ source: 'meter' });
    expect(year.hours.toFixed(1)).toBe('270.0');
    expect((await usage.acresInPeriod(fx.operationId, id, '2025-01-01', '2025-12-31')).toFixed(3)).toBe('80.000');
    // Early May holds no two readings to compare; the entries are all there is.
    const may = await usage.hoursInPeriod(fx.operationId, id, '2025-05-01', '2025-05-31');
    expect(may.meterHours).toBeNull();
    expect(may).toMatchObject({ source: 'entries' });
    expect(may.hours.toFixed(2)).toBe('10.50');
  });
});
