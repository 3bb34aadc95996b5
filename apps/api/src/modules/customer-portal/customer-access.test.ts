import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { listRoutes } from '../../common/auth/route-inventory.js';
import { createOperation, signInAll, type OperationFixture } from '../../test-support/fixtures.js';
import { createTestApp, type TestApp } from '../../test-support/test-app.js';
import { addEntry, addNeighbourSheet, createBillingWorld, type BillingWorld } from '../invoices/billing-world.fixture.js';

let t: TestApp;
let world: BillingWorld<OperationFixture>;
let tokens: Awaited<ReturnType<typeof signInAll>>;
let mine: { issued: string; voided: string; draft: string };
let theirs: string;
const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });

async function invoiceFor(partyId: string, workDate: string, issue: boolean): Promise<string> {
  await addEntry(t.dbh.db, world, { workDate, workTypeId: world.workTypes.mowing, fieldId: world.fields.creekBottom, billToPartyId: partyId, hours: '2.00', acres: '10.000' });
  const d = await t.http().post('/api/invoices/drafts').set(bearer(tokens.owner)).send({ partyId, from: workDate, to: workDate });
  if (issue) expect((await t.http().post(`/api/invoices/${d.body.id}/issue`).set(bearer(tokens.owner)).send({})).status).toBe(200);
  return d.body.id;
}

beforeAll(async () => {
  t = await createTestApp();
  world = await createBillingWorld(t.dbh.db, await createOperation(t.dbh.db));
  tokens = await signInAll(t, world.fx);
  await addNeighbourSheet(t.dbh.db, world);
  await addNeighbourSheet(t.dbh.db, world, { name: 'Agency rates', relationship: 'agency' });
  const [customerParty, otherParty] = world.fx.customers;
  mine = { issued: await invoiceFor(customerParty, '2025-05-01', true), voided: await invoiceFor(customerParty, '2025-05-02', true), draft: await invoiceFor(customerParty, '2025-05-03', false) };
  await t.http().post(`/api/invoices/${mine.voided}/void`).set(bearer(tokens.owner)).send({ reason: 'Wrong field' });
  theirs = await invoiceFor(otherParty, '2025-05-04', true);
});
afterAll(() => t.close());

describe("a customer's own view", () => {
  it('lists only the invoices issued to their own party, whatever the query asks for', async () => {
    const list = await t.http().get('/api/invoices').set(bearer(tokens.customer));
    expect(list.status).toBe(200);
    expect(list.body.items.map((i: { id: string }) => i.id).sort()).toEqual([mine.issued, mine.voided].sort());
    expect(list.body.items.find((i: { id: string }) => i.id === mine.voided).state).toBe('void');
    const sneaky = await t.http().get(`/api/invoices?partyId=${world.fx.customers[1]}&state=draft,issued`).set(bearer(tokens.customer));
    expect(sneaky.body).toMatchObject({ total: 0, items: [] });
  });

  it('shows their invoice with the work on it, and nothing of machines, operators or costs', async () => {
    const res = await t.http().get(`/api/invoices/${mine.issued}`).set(bearer(tokens.customer));
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ state: 'issued', balance: '210.00', payUrl: `http://hitchbook.test/pay/${mine.issued}` });
    expect(res.body.entries).toHaveLength(1);
    expect(Object.keys(res.body.entries[0]).sort()).toEqual(['acres', 'eachCount', 'fieldName', 'hours', 'id', 'loads', 'miles', 'workDate', 'workTypeName']);
    expect(res.body.entries[0]).toMatchObject({ workDate: '2025-05-01', fieldName: 'Creek Bottom', acres: '10.000' });
    const text = JSON.stringify(res.body);
    for (const internal of [world.machines.tractor, world.machines.mower, world.fx.members.operator.userId, 'rateSheetId', 'entryVersion', 'details']) {
      expect(text).not.toContain(internal);
    }
  });

  it("answers 404 for another customer's invoice and for their own draft, in every invoice route", async () => {
    for (const id of [theirs, mine.draft]) {
      expect((await t.http().get(`/api/invoices/${id}`).set(bearer(tokens.customer))).status).toBe(404);
      expect((await t.http().get(`/api/invoices/${id}/pdf`).set(bearer(tokens.customer))).status).toBe(404);
      expect((await t.http().get(`/api/invoices/${id}/payments`).set(bearer(tokens.customer))).status).toBe(404);
    }
    expect((await t.http().get(`/api/invoices/${theirs}`).set(bearer(tokens.customer2))).status).toBe(200);
  });

  it('refuses a customer every route that does not name the customer role', async () => {
    const staffOnly = listRoutes(t.app).filter((r) => !r.isPublic && r.roles && !r.roles.includes('customer'));
    expect(staffOnly.map((r) => `${r.method} ${r.path}`)).toEqual(expect.arrayContaining(['POST /api/invoices/drafts', 'POST /api/invoices/:id/issue', 'GET /api/rate-sheets']));
    for (const route of staffOnly) {
      const path = route.path.replace(/:[a-zA-Z]+/g, mine.issued);
      const res = await t.http()[route.method.toLowerCase() as 'get' | 'post' | 'patch' | 'put' | 'delete'](path).set(bearer(tokens.customer)).send({});
      expect(res.status, `${route.method} ${route.path}`).toBe(403);
    }
    const [row] = await t.dbh.db.query.invoices.findMany({ where: (i, { eq }) => eq(i.id, mine.issued) });
    expect(row).toMatchObject({ status: 'issued', sentAt: null });
  });

  it("keeps another operation's owner out of this operation's invoices", async () => {
    const elsewhere = await createOperation(t.dbh.db, 'Elsewhere');
    const owner = (await signInAll(t, elsewhere)).owner;
    expect((await t.http().get(`/api/invoices/${mine.issued}`).set(bearer(owner))).status).toBe(404);
    expect((await t.http().post(`/api/invoices/${mine.issued}/void`).set(bearer(owner)).send({ reason: 'Not mine' })).status).toBe(404);
    expect((await t.http().post(`/api/invoices/${mine.issued}/payments`).set(bearer(owner)).send({ method: 'cash', amount: '1', receivedOn: '2025-05-05' })).status).toBe(404);
    expect((await t.http().get('/api/invoices').set(bearer(owner))).body.total).toBe(0);
  });
});
