import { eq } from 'drizzle-orm';
import { invoices } from '@hitchbook/db';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createOperation, signInAll, type OperationFixture } from '../../test-support/fixtures.js';
import { createTestApp, type TestApp } from '../../test-support/test-app.js';
import { addEntry, addNeighbourSheet, createBillingWorld, type BillingWorld } from './billing-world.fixture.js';

// The role table of the product: the owner manages invoices; a partner household and the bookkeeper
// read them, their payments and PDFs, and change nothing. The web's role → areas map says the same.

let t: TestApp;
let world: BillingWorld<OperationFixture>;
let tokens: Awaited<ReturnType<typeof signInAll>>;
const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });

beforeAll(async () => {
  t = await createTestApp();
  world = await createBillingWorld(t.dbh.db, await createOperation(t.dbh.db));
  tokens = await signInAll(t, world.fx);
  await addNeighbourSheet(t.dbh.db, world);
});
afterAll(() => t.close());

async function issuedInvoice(workDate: string): Promise<{ id: string; version: number }> {
  const partyId = world.fx.customers[0];
  await addEntry(t.dbh.db, world, { workDate, workTypeId: world.workTypes.mowing, fieldId: world.fields.creekBottom, billToPartyId: partyId, hours: '2.00', acres: '10.000' });
  const d = await t.http().post('/api/invoices/drafts').set(bearer(tokens.owner)).send({ partyId, from: workDate, to: workDate });
  const issued = await t.http().post(`/api/invoices/${d.body.id}/issue`).set(bearer(tokens.owner)).send({});
  expect(issued.status).toBe(200);
  return issued.body;
}

describe('invoices for the partner and the bookkeeper', () => {
  it('lets both read invoices, their payments and PDFs', async () => {
    const invoice = await issuedInvoice('2025-07-01');
    await t.http().post(`/api/invoices/${invoice.id}/payments`).set(bearer(tokens.owner)).send({ method: 'cash', amount: '10', receivedOn: '2025-07-02' });
    for (const role of ['partner', 'bookkeeper'] as const) {
      const list = await t.http().get('/api/invoices').set(bearer(tokens[role]));
      expect(list.status, role).toBe(200);
      expect(list.body.items.map((i: { id: string }) => i.id), role).toContain(invoice.id);
      expect((await t.http().get(`/api/invoices/${invoice.id}`).set(bearer(tokens[role]))).body, role).toMatchObject({ id: invoice.id, amountPaid: '10.00' });
      const paid = await t.http().get(`/api/invoices/${invoice.id}/payments`).set(bearer(tokens[role]));
      expect(paid.body.map((p: { amount: string }) => p.amount), role).toEqual(['10.00']);
      expect((await t.http().get(`/api/invoices/${invoice.id}/pdf`).set(bearer(tokens[role]))).status, role).toBe(200);
    }
  });

  it('refuses both every billing write with 403 and changes nothing', async () => {
    const invoice = await issuedInvoice('2025-07-03');
    const recorded = await t.http().post(`/api/invoices/${invoice.id}/payments`).set(bearer(tokens.owner)).send({ method: 'cash', amount: '10', receivedOn: '2025-07-04' });
    const paymentId = recorded.body.payment.id as string;
    const writes = [
      ['post', '/api/invoices/drafts', { partyId: world.fx.customers[0], from: '2025-07-05', to: '2025-07-05' }],
      ['post', `/api/invoices/${invoice.id}/payments`, { method: 'cheque', amount: '5', receivedOn: '2025-07-04' }],
      ['post', `/api/invoices/${invoice.id}/payments/${paymentId}/refund`, {}],
      ['post', `/api/invoices/${invoice.id}/send`, {}],
      ['post', `/api/invoices/${invoice.id}/void`, { reason: 'Wrong party' }],
      ['post', `/api/invoices/${invoice.id}/credit-notes`, { reason: 'Rain' }],
      ['post', `/api/invoices/${invoice.id}/checkout`, {}],
    ] as const;
    for (const role of ['partner', 'bookkeeper'] as const) {
      for (const [method, path, body] of writes) expect((await t.http()[method](path).set(bearer(tokens[role])).send(body)).status, `${role} ${path}`).toBe(403);
    }
    const [row] = await t.dbh.db.select().from(invoices).where(eq(invoices.id, invoice.id));
    expect(row).toMatchObject({ status: 'issued', amountPaid: '10.00', version: invoice.version + 1 });
  });
});
