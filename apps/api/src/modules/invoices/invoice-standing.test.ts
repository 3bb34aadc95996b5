import { eq, sql } from 'drizzle-orm';
import { invoices, parties, payments } from '@hitchbook/db';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createOperation, signInAll, type OperationFixture } from '../../test-support/fixtures.js';
import { waitForMail } from '../../test-support/mailbox.js';
import { createTestApp, type TestApp } from '../../test-support/test-app.js';
import { addEntry, addNeighbourSheet, createBillingWorld, type BillingWorld } from './billing-world.fixture.js';

let t: TestApp;
let world: BillingWorld<OperationFixture>;
let tokens: Awaited<ReturnType<typeof signInAll>>;
let neighbour: string;
let agency: string;
const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });

beforeAll(async () => {
  t = await createTestApp();
  world = await createBillingWorld(t.dbh.db, await createOperation(t.dbh.db));
  tokens = await signInAll(t, world.fx);
  [neighbour, agency] = world.fx.customers;
  await addNeighbourSheet(t.dbh.db, world);
  await addNeighbourSheet(t.dbh.db, world, { name: 'Agency rates', relationship: 'agency' });
});
afterAll(() => t.close());

/** An issued invoice for 10 acres of mowing on the day: 185.00 + 25.00 travel = 210.00. */
async function issuedInvoice(workDate: string, partyId = neighbour): Promise<{ id: string; numberLabel: string }> {
  await addEntry(t.dbh.db, world, { workDate, workTypeId: world.workTypes.mowing, fieldId: world.fields.creekBottom, billToPartyId: partyId, hours: '2.00', acres: '10.000' });
  const d = await t.http().post('/api/invoices/drafts').set(bearer(tokens.owner)).send({ partyId, from: workDate, to: workDate });
  const issued = await t.http().post(`/api/invoices/${d.body.id}/issue`).set(bearer(tokens.owner)).send({});
  expect(issued.status).toBe(200);
  return issued.body;
}

const pay = (id: string, body: Record<string, unknown>, token = tokens.owner) => t.http().post(`/api/invoices/${id}/payments`).set(bearer(token)).send(body);
const standing = async (id: string) => (await t.http().get(`/api/invoices/${id}`).set(bearer(tokens.owner))).body as { state: string; balance: string; amountPaid: string };

describe('payments and the state of an invoice', () => {
  it('goes from issued to partly paid to paid with manual payments, and mails a receipt', async () => {
    const invoice = await issuedInvoice('2025-03-03');
    expect(await standing(invoice.id)).toMatchObject({ state: 'issued', balance: '210.00' });

    const cheque = await pay(invoice.id, { method: 'cheque', amount: '60.5', receivedOn: '2025-03-10', reference: 'Cheque 1042' });
    expect(cheque.status).toBe(201);
    expect(cheque.body.payment).toMatchObject({ method: 'cheque', amount: '60.50', receivedOn: '2025-03-10', reference: 'Cheque 1042', status: 'succeeded' });
    expect(cheque.body.invoice).toMatchObject({ state: 'partly-paid', amountPaid: '60.50', balance: '149.50' });
    const [party] = await t.dbh.db.select({ email: parties.email }).from(parties).where(eq(parties.id, neighbour));
    const receipt = await waitForMail(party!.email!, `Payment received for invoice ${invoice.numberLabel}`);
    expect(receipt.text).toContain('$60.50 by cheque on 2025-03-10');
    expect(receipt.text).toContain('$149.50 remains open');

    const transfer = await pay(invoice.id, { method: 'transfer', amount: 149.5, receivedOn: '2025-03-12' });
    expect(transfer.body.invoice).toMatchObject({ state: 'paid', balance: '0.00', amountPaid: '210.00' });
    const list = await t.http().get(`/api/invoices/${invoice.id}/payments`).set(bearer(tokens.bookkeeper));
    expect(list.body.map((p: { amount: string }) => p.amount)).toEqual(['60.50', '149.50']);
  });

  it('refuses a payment over the balance, in the future, by card or on a draft, and records nothing', async () => {
    const invoice = await issuedInvoice('2025-03-04');
    const over = await pay(invoice.id, { method: 'cash', amount: '210.01', receivedOn: '2025-03-10' });
    expect(over.status).toBe(400);
    expect(over.body.issues).toEqual([{ path: 'amount', message: 'At most the open balance of 210.00.' }]);
    const future = await pay(invoice.id, { method: 'cash', amount: '10', receivedOn: '2099-01-01' });
    expect(future.status).toBe(400);
    expect(future.body.issues[0].path).toBe('receivedOn');
    const card = await pay(invoice.id, { method: 'card', amount: '10', receivedOn: '2025-03-10', stripePaymentIntentId: 'pi_forged' });
    expect(card.status).toBe(400);
    expect(card.body.issues.map((i: { path: string }) => i.path).sort()).toEqual(['method', 'stripePaymentIntentId']);
    const cents = await pay(invoice.id, { method: 'cash', amount: '1.005', receivedOn: '2025-03-10' });
    expect(cents.status).toBe(400);
    expect((await pay(invoice.id, { method: 'cash', amount: '10', receivedOn: '2025-03-10' }, tokens.bookkeeper)).status).toBe(403);
    expect(await t.dbh.db.select().from(payments).where(eq(payments.invoiceId, invoice.id))).toEqual([]);
    expect(await standing(invoice.id)).toMatchObject({ state: 'issued', balance: '210.00', amountPaid: '0.00' });

    await addEntry(t.dbh.db, world, { workDate: '2025-03-05', workTypeId: world.workTypes.mowing, fieldId: world.fields.creekBottom, billToPartyId: neighbour, hours: '2.00', acres: '10.000' });
    const d = await t.http().post('/api/invoices/drafts').set(bearer(tokens.owner)).send({ partyId: neighbour, from: '2025-03-05', to: '2025-03-05' });
    expect((await pay(d.body.id, { method: 'cash', amount: '10', receivedOn: '2025-03-10' })).status).toBe(409);
  });

  it('is overdue once the due date has passed with money owed, partly paid or not, and never when paid', async () => {
    const unpaid = await issuedInvoice('2025-02-03');
    const partly = await issuedInvoice('2025-02-04');
    const paid = await issuedInvoice('2025-02-05');
    await pay(partly.id, { method: 'cash', amount: '10', receivedOn: '2025-02-20' });
    await pay(paid.id, { method: 'cash', amount: '210', receivedOn: '2025-02-20' });
    // Time passes: the due dates fall a day before today.
    for (const id of [unpaid.id, partly.id, paid.id]) {
      await t.dbh.db.update(invoices).set({ dueDate: sql`current_date - 1` }).where(eq(invoices.id, id));
    }
    expect(await standing(unpaid.id)).toMatchObject({ state: 'overdue', balance: '210.00' });
    expect(await standing(partly.id)).toMatchObject({ state: 'overdue', balance: '200.00' });
    expect(await standing(paid.id)).toMatchObject({ state: 'paid', balance: '0.00' });

    const overdue = await t.http().get('/api/invoices?state=overdue&pageSize=200').set(bearer(tokens.partner));
    const ids = overdue.body.items.map((i: { id: string }) => i.id);
    expect(ids).toEqual(expect.arrayContaining([unpaid.id, partly.id]));
    expect(ids).not.toContain(paid.id);
    expect(overdue.body.items.every((i: { state: string }) => i.state === 'overdue')).toBe(true);
  });

  it('lists with paging and filters by party, state, kind and issue date', async () => {
    const forAgency = await issuedInvoice('2025-01-15', agency);
    const byParty = await t.http().get(`/api/invoices?partyId=${agency}`).set(bearer(tokens.bookkeeper));
    expect(byParty.status).toBe(200);
    expect(byParty.body).toMatchObject({ total: 1, page: 1, pageSize: 25, items: [{ id: forAgency.id, partyId: agency, numberLabel: forAgency.numberLabel }] });

    const all = await t.http().get('/api/invoices?kind=invoice&state=issued,partly-paid,paid,overdue').set(bearer(tokens.owner));
    const paged = await t.http().get('/api/invoices?kind=invoice&state=issued,partly-paid,paid,overdue&pageSize=2&page=2&sort=number').set(bearer(tokens.owner));
    expect(paged.body).toMatchObject({ total: all.body.total, page: 2, pageSize: 2 });
    expect(paged.body.items).toHaveLength(2);
    expect(paged.body.items.map((i: { number: number }) => i.number)).toEqual([3, 4]);

    const today = new Date().toISOString().slice(0, 10);
    const none = await t.http().get('/api/invoices?from=2000-01-01&to=2000-12-31').set(bearer(tokens.owner));
    expect(none.body).toMatchObject({ total: 0, items: [] });
    const issuedRecently = await t.http().get(`/api/invoices?from=2000-01-01&state=issued&partyId=${agency}`).set(bearer(tokens.owner));
    expect(issuedRecently.body.items.map((i: { issueDate: string }) => i.issueDate <= today)).toEqual([true]);

    const bad = await t.http().get('/api/invoices?state=lost&pageSize=1000&from=2025-13-01').set(bearer(tokens.owner));
    expect(bad.status).toBe(400);
    expect(bad.body.issues.map((i: { path: string }) => i.path).sort()).toEqual(['from', 'pageSize', 'state.0']);
  });

  it('keeps money from operators entirely', async () => {
    const invoice = await issuedInvoice('2025-01-20');
    expect((await t.http().get('/api/invoices').set(bearer(tokens.operator))).status).toBe(403);
    expect((await t.http().get(`/api/invoices/${invoice.id}`).set(bearer(tokens.operator))).status).toBe(403);
    expect((await t.http().get(`/api/invoices/${invoice.id}/pdf`).set(bearer(tokens.operator))).status).toBe(403);
    expect((await t.http().get(`/api/invoices/${invoice.id}/payments`).set(bearer(tokens.operator))).status).toBe(403);
  });
});
