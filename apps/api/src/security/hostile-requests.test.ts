import { eq } from 'drizzle-orm';
import { invoices, meterReadings } from '@hitchbook/db';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addEntry, addNeighbourSheet, createBillingWorld, type BillingWorld } from '../modules/invoices/billing-world.fixture.js';
import { createOperation, signInAll, type OperationFixture } from '../test-support/fixtures.js';
import { createTestApp, type TestApp } from '../test-support/test-app.js';

/** Requests a careless or hostile caller sends, each answered with a clear refusal and no change. */

let t: TestApp;
let fx: OperationFixture;
let world: BillingWorld<OperationFixture>;
let tok: Record<string, string>;

beforeAll(async () => {
  t = await createTestApp();
  fx = await createOperation(t.dbh.db, 'Hostile outfit');
  world = await createBillingWorld(t.dbh.db, fx);
  await addNeighbourSheet(t.dbh.db, world);
  tok = await signInAll(t, fx);
});
afterAll(() => t?.close());

const auth = (role: string) => ({ Authorization: `Bearer ${tok[role]}` });

describe('dates outside the years the product deals in', () => {
  it('refuses a meter reading dated in year 17 instead of failing after storing it', async () => {
    const res = await t
      .http()
      .post(`/api/machines/${world.machines.tractor}/meter-readings`)
      .set(auth('owner'))
      .send({ readAt: '0017-02-23T20:06:07+10:36', hours: '250.0' });
    expect(res.status).toBe(400);
    expect(res.body.issues).toEqual([expect.objectContaining({ path: 'readAt' })]);
    const stored = await t.dbh.db.select().from(meterReadings).where(eq(meterReadings.machineId, world.machines.tractor));
    expect(stored).toEqual([]);
  });

  it('refuses a work entry started in year 17', async () => {
    const res = await t
      .http()
      .post('/api/work-entries')
      .set(auth('owner'))
      .send({ workDate: '2025-06-02', workTypeId: world.workTypes.mowing, fieldId: world.fields.creekBottom, startedAt: '0017-06-02T07:00:00Z', hours: '2.00' });
    expect(res.status).toBe(400);
    expect(JSON.stringify(res.body.issues)).toContain('startedAt');
  });
});

describe('issuing a draft with nothing on it', () => {
  it('answers 409 naming the problem and takes no number', async () => {
    const [draft] = await t.dbh.db.insert(invoices).values({ operationId: fx.operationId, partyId: fx.customers[0], status: 'draft' }).returning({ id: invoices.id });
    const res = await t.http().post(`/api/invoices/${draft!.id}/issue`).set(auth('owner')).send({});
    expect(res.status).toBe(409);
    expect(res.body.message).toMatch(/no lines/);
    const [row] = await t.dbh.db.select().from(invoices).where(eq(invoices.id, draft!.id));
    expect(row).toMatchObject({ status: 'draft', number: null });
  });

  it('still issues a draft made from approved work', async () => {
    await addEntry(t.dbh.db, world, { workDate: '2025-06-03', workTypeId: world.workTypes.mowing, fieldId: world.fields.creekBottom, billToPartyId: fx.customers[0], hours: '2.00', acres: '10.000' });
    const draft = await t.http().post('/api/invoices/drafts').set(auth('owner')).send({ partyId: fx.customers[0], from: '2025-06-01', to: '2025-06-30' });
    expect(draft.status).toBe(201);
    const issued = await t.http().post(`/api/invoices/${draft.body.id}/issue`).set(auth('owner')).send({});
    expect(issued.status).toBe(200);
    expect(issued.body.status).toBe('issued');
  });
});
