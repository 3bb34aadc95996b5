import { randomUUID } from 'node:crypto';
import type { AddressInfo } from 'node:net';
import { eq } from 'drizzle-orm';
import Stripe from 'stripe';
import { auditLog, checkoutSessions, invoices, parties, paymentRefunds, payments, stripeEvents } from '@hitchbook/db';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createOperation, signInAll, type OperationFixture } from '../../test-support/fixtures.js';
import { waitForMail } from '../../test-support/mailbox.js';
import { completedSessionEvent, testStripeId } from '../../test-support/stripe-events.js';
import { createTestApp, type TestApp } from '../../test-support/test-app.js';
import { addEntry, addNeighbourSheet, createBillingWorld, type BillingWorld } from '../invoices/billing-world.fixture.js';

function fakeUrl(): string {
  const url = process.env.STRIPE_FAKE_URL;
  if (!url) throw new Error('STRIPE_FAKE_URL is not set: run the tests through `npm test`, which starts the Stripe fake.');
  return url.replace(/\/$/, '');
}

let t: TestApp;
let stripe: Stripe;
let webhookSecret: string;
let world: BillingWorld<OperationFixture>;
let tokens: Awaited<ReturnType<typeof signInAll>>;
let neighbour: string;
let neighbourEmail: string;
let day = 0;
const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });

beforeAll(async () => {
  t = await createTestApp();
  if (!t.config.stripe) throw new Error('STRIPE_SECRET_KEY and STRIPE_WEBHOOK_SECRET are not set: run the tests through `npm test`.');
  webhookSecret = t.config.stripe.webhookSecret;
  const fake = new URL(fakeUrl());
  stripe = new Stripe(t.config.stripe.secretKey, { host: fake.hostname, port: Number(fake.port), protocol: 'http', maxNetworkRetries: 0 });
  world = await createBillingWorld(t.dbh.db, await createOperation(t.dbh.db));
  tokens = await signInAll(t, world.fx);
  neighbour = world.fx.customers[0];
  neighbourEmail = `okonkwo-${randomUUID().slice(0, 8)}@example.test`;
  await t.dbh.db.update(parties).set({ email: neighbourEmail }).where(eq(parties.id, neighbour));
  await addNeighbourSheet(t.dbh.db, world);
});
afterAll(() => t.close());

/** An issued invoice for the neighbour: 10 acres of mowing, 185.00 + 25.00 travel = 210.00. */
async function issuedInvoice(): Promise<{ id: string; numberLabel: string }> {
  const workDate = `2025-05-${String(++day).padStart(2, '0')}`;
  await addEntry(t.dbh.db, world, { workDate, workTypeId: world.workTypes.mowing, fieldId: world.fields.creekBottom, billToPartyId: neighbour, hours: '2.00', acres: '10.000' });
  const d = await t.http().post('/api/invoices/drafts').set(bearer(tokens.owner)).send({ partyId: neighbour, from: workDate, to: workDate });
  const issued = await t.http().post(`/api/invoices/${d.body.id}/issue`).set(bearer(tokens.owner)).send({});
  expect(issued.status).toBe(200);
  return issued.body;
}

const checkout = (id: string, token = tokens.customer, body: object = {}) => t.http().post(`/api/invoices/${id}/checkout`).set(bearer(token)).send(body);

async function storedSession(invoiceId: string) {
  const [row] = await t.dbh.db.select().from(checkoutSessions).where(eq(checkoutSessions.invoiceId, invoiceId));
  return row!;
}

const standing = async (id: string) => (await t.http().get(`/api/invoices/${id}`).set(bearer(tokens.owner))).body as { state: string; balance: string; amountPaid: string };
const paymentsOf = (invoiceId: string) => t.dbh.db.select().from(payments).where(eq(payments.invoiceId, invoiceId));

/** Posts an event the way Stripe does: pretty-printed JSON, signed over the exact bytes sent. */
function deliver(event: object, options: { secret?: string; timestamp?: number; body?: string; signature?: string | null } = {}) {
  const payload = JSON.stringify(event, null, 2);
  const signature =
    options.signature === undefined ? stripe.webhooks.generateTestHeaderString({ payload, secret: options.secret ?? webhookSecret, timestamp: options.timestamp }) : options.signature;
  const req = t.http().post('/api/payments/stripe-webhook').set('Content-Type', 'application/json');
  return (signature === null ? req : req.set('Stripe-Signature', signature)).send(options.body ?? payload);
}

async function fakeEvent(type: string, objectId: string): Promise<Stripe.Event> {
  const list = (await (await fetch(`${fakeUrl()}/_fake/events?type=${type}&object=${objectId}`)).json()) as { data: Array<{ id: string }> };
  expect(list.data.length, `${type} for ${objectId}`).toBeGreaterThan(0);
  return stripe.events.retrieve(list.data[0]!.id);
}

const payOnFake = (sessionId: string, cardNumber: string) =>
  fetch(`${fakeUrl()}/_fake/checkout/sessions/${sessionId}/pay`, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ card_number: cardNumber, exp_month: 12, exp_year: 2040, cvc: '123' }) });

describe('paying an invoice by card through the Stripe fake', () => {
  it('pays with 4242… and the signed webhook the fake sends marks the invoice paid, once', async () => {
    const invoice = await issuedInvoice();
    await t.app.listen(0, '127.0.0.1');
    const port = (t.app.getHttpServer().address() as AddressInfo).port;
    const endpoint = await fetch(`${fakeUrl()}/_fake/webhook-endpoint`, {
      method: 'PUT',
      headers: { 'Content-Type': 'application/json' },
      body: JSON.stringify({ url: `http://127.0.0.1:${port}/api/payments/stripe-webhook`, secret: webhookSecret }),
    });
    expect(endpoint.status).toBe(200);
    try {
      const opened = await checkout(invoice.id);
      expect(opened.status).toBe(200);
      const session = await storedSession(invoice.id);
      expect(opened.body).toMatchObject({ url: session.url, amount: '210.00', currency: 'usd' });
      expect((await payOnFake(session.stripeSessionId, '4242 4242 4242 4242')).status).toBe(200);

      let state = '';
      for (let i = 0; i < 60 && state !== 'paid'; i++) {
        state = (await standing(invoice.id)).state;
        if (state !== 'paid') await new Promise((r) => setTimeout(r, 250));
      }
      expect(state).toBe('paid');
      const [payment] = await paymentsOf(invoice.id);
      expect(payment).toMatchObject({ method: 'card', amount: '210.00', stripeCheckoutSessionId: session.stripeSessionId });
      const receipt = await waitForMail(neighbourEmail, `Payment received for invoice ${invoice.numberLabel}`);
      expect(receipt.text).toContain('$210.00 by card');
      expect(receipt.text).toContain('paid in full');

      // Stripe may deliver the same event again: nothing changes.
      const completed = await fakeEvent('checkout.session.completed', session.stripeSessionId);
      expect((await fetch(`${fakeUrl()}/_fake/events/${completed.id}/resend`, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: '{}' })).status).toBe(200);
      await new Promise((r) => setTimeout(r, 1000));
      expect(await paymentsOf(invoice.id)).toHaveLength(1);
      expect(await standing(invoice.id)).toMatchObject({ state: 'paid', amountPaid: '210.00' });
      expect((await checkout(invoice.id)).status).toBe(409);
    } finally {
      await fetch(`${fakeUrl()}/_fake/webhook-endpoint`, { method: 'PUT', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ url: null }) });
    }
  });

  it('opens the checkout for the open balance from the server, the same one on a second click', async () => {
    const invoice = await issuedInvoice();
    await t.http().post(`/api/invoices/${invoice.id}/payments`).set(bearer(tokens.owner)).send({ method: 'cheque', amount: '60', receivedOn: '2025-05-20' });
    const [first, second] = await Promise.all([checkout(invoice.id), checkout(invoice.id)]);
    expect(first.status).toBe(200);
    expect(second.body.url).toBe(first.body.url);
    expect(first.body.amount).toBe('150.00');
    const stored = await t.dbh.db.select().from(checkoutSessions).where(eq(checkoutSessions.invoiceId, invoice.id));
    expect(stored).toHaveLength(1);
    const session = await stripe.checkout.sessions.retrieve(stored[0]!.stripeSessionId);
    expect(session).toMatchObject({ amount_total: 15000, currency: 'usd', client_reference_id: invoice.id, metadata: { operationId: world.fx.operationId, invoiceId: invoice.id }, customer_email: neighbourEmail });

    const withAmount = await checkout(invoice.id, tokens.customer, { amount: 1 });
    expect(withAmount.status).toBe(400);
    expect(withAmount.body.issues[0].path).toBe('amount');
  });

  it("refuses another customer's invoice with 404, staff without a paying role with 403, and drafts with 409", async () => {
    const invoice = await issuedInvoice();
    expect((await checkout(invoice.id, tokens.customer2)).status).toBe(404);
    for (const role of ['partner', 'bookkeeper', 'operator'] as const) expect((await checkout(invoice.id, tokens[role])).status, role).toBe(403);
    expect(await t.dbh.db.select().from(checkoutSessions).where(eq(checkoutSessions.invoiceId, invoice.id))).toEqual([]);

    await addEntry(t.dbh.db, world, { workDate: '2025-06-30', workTypeId: world.workTypes.mowing, fieldId: world.fields.creekBottom, billToPartyId: neighbour, hours: '2.00', acres: '10.000' });
    const d = await t.http().post('/api/invoices/drafts').set(bearer(tokens.owner)).send({ partyId: neighbour, from: '2025-06-30', to: '2025-06-30' });
    expect((await checkout(d.body.id, tokens.owner)).status).toBe(409);
    expect((await checkout(d.body.id, tokens.customer)).status).toBe(404);
  });

  it('leaves the invoice open when the card is declined', async () => {
    const invoice = await issuedInvoice();
    await checkout(invoice.id);
    const session = await storedSession(invoice.id);
    const declined = await payOnFake(session.stripeSessionId, '4000 0000 0000 0002');
    expect(declined.status).toBe(402);
    const intent = ((await stripe.checkout.sessions.retrieve(session.stripeSessionId)).payment_intent as string | null)!;
    const failed = await fakeEvent('payment_intent.payment_failed', intent);
    expect((await deliver(failed)).status).toBe(200);

    expect(await standing(invoice.id)).toMatchObject({ state: 'issued', balance: '210.00' });
    expect(await paymentsOf(invoice.id)).toEqual([]);
    const [recorded] = await t.dbh.db.select().from(stripeEvents).where(eq(stripeEvents.id, failed.id));
    expect(recorded?.outcome).toContain('card declined');
    expect((await storedSession(invoice.id)).status).toBe('open');
  });
});

describe('the Stripe webhook', () => {
  it('refuses a forged, unsigned, stale or re-serialised event with 400 and changes nothing', async () => {
    const invoice = await issuedInvoice();
    await checkout(invoice.id);
    const event = completedSessionEvent(await storedSession(invoice.id));

    const forged = await deliver(event, { secret: 'whsec_not_the_endpoint_secret' });
    expect(forged.status).toBe(400);
    expect(forged.body.issues[0].path).toBe('Stripe-Signature');
    expect((await deliver(event, { signature: null })).status).toBe(400);
    expect((await deliver(event, { timestamp: Math.floor(Date.now() / 1000) - 301 })).status).toBe(400);
    expect((await deliver(event, { body: JSON.stringify(event) })).status).toBe(400);
    expect(await t.dbh.db.select().from(stripeEvents).where(eq(stripeEvents.id, event.id))).toEqual([]);
    expect(await standing(invoice.id)).toMatchObject({ state: 'issued', balance: '210.00' });

    // The same event, properly signed, is good: the refusals above were about the signature alone.
    expect((await deliver(event)).status).toBe(200);
    expect(await standing(invoice.id)).toMatchObject({ state: 'paid', balance: '0.00' });
  });

  it('books a replayed or duplicated event once, even when the copies arrive together', async () => {
    const invoice = await issuedInvoice();
    await checkout(invoice.id);
    const session = await storedSession(invoice.id);
    const event = completedSessionEvent(session);
    const deliveries = await Promise.all([deliver(event), deliver(event), deliver(event)]);
    expect(deliveries.map((d) => d.status)).toEqual([200, 200, 200]);
    // Another event about the same payment (a second event id) books nothing either.
    const sameIntent = { ...event, id: testStripeId('evt') };
    expect((await deliver(sameIntent)).status).toBe(200);

    expect(await paymentsOf(invoice.id)).toHaveLength(1);
    expect(await standing(invoice.id)).toMatchObject({ state: 'paid', amountPaid: '210.00' });
    const [second] = await t.dbh.db.select().from(stripeEvents).where(eq(stripeEvents.id, sameIntent.id));
    expect(second?.outcome).toBe('payment already recorded');
  });

  it('records an amount, currency or invoice mismatch and books nothing', async () => {
    const invoice = await issuedInvoice();
    const other = await issuedInvoice();
    await checkout(invoice.id);
    const session = await storedSession(invoice.id);
    const tampered = [
      completedSessionEvent(session, { amount_total: 100 }),
      completedSessionEvent(session, { currency: 'eur' }),
      completedSessionEvent(session, { metadata: { operationId: session.operationId, invoiceId: other.id } }),
      completedSessionEvent({ ...session, stripeSessionId: 'cs_test_never_opened_here' }),
    ];
    for (const event of tampered) expect((await deliver(event)).status).toBe(200);

    expect(await paymentsOf(invoice.id)).toEqual([]);
    expect(await paymentsOf(other.id)).toEqual([]);
    expect(await standing(invoice.id)).toMatchObject({ state: 'issued', balance: '210.00' });
    const outcomes = await Promise.all(tampered.map(async (e) => (await t.dbh.db.select().from(stripeEvents).where(eq(stripeEvents.id, e.id)))[0]?.outcome));
    expect(outcomes).toEqual(['mismatch: amount 100 ≠ 21000', 'mismatch: currency eur ≠ usd', 'mismatch: invoice', 'unknown checkout session']);
    const flagged = await t.dbh.db.select().from(auditLog).where(eq(auditLog.entityId, invoice.id));
    expect(flagged.filter((a) => a.action === 'payment.mismatch')).toHaveLength(3);
  });

  it('ends paid whatever order the events come in', async () => {
    const invoice = await issuedInvoice();
    await checkout(invoice.id);
    const session = await storedSession(invoice.id);
    const failedFirst = { id: testStripeId('evt'), object: 'event', type: 'payment_intent.payment_failed', created: Math.floor(Date.now() / 1000), data: { object: { id: 'pi_test_x', object: 'payment_intent', last_payment_error: { message: 'Your card was declined.' } } } };
    const expiredLate = { ...completedSessionEvent(session, { status: 'expired', payment_status: 'unpaid' }), type: 'checkout.session.expired' };
    for (const event of [failedFirst, completedSessionEvent(session), expiredLate]) expect((await deliver(event)).status).toBe(200);
    expect(await standing(invoice.id)).toMatchObject({ state: 'paid' });
    expect((await storedSession(invoice.id)).status).toBe('complete');
  });

  it('answers 503 everywhere card payments are not configured', async () => {
    const invoice = await issuedInvoice();
    const bare = await createTestApp({ stripe: null });
    try {
      const res = await bare.http().post(`/api/invoices/${invoice.id}/checkout`).set(bearer(tokens.customer)).send({});
      expect(res.status).toBe(503);
      expect(res.body.message).toBe('Card payments are not configured.');
      expect((await bare.http().post('/api/payments/stripe-webhook').set('Content-Type', 'application/json').send('{}')).status).toBe(503);
    } finally {
      await bare.close();
    }
    const [row] = await t.dbh.db.select({ amountPaid: invoices.amountPaid }).from(invoices).where(eq(invoices.id, invoice.id));
    expect(row?.amountPaid).toBe('0.00');
  });
});

/** Pays the invoice's checkout on the fake with 4242… and delivers Stripe's completed event for it. */
async function paidByCard(invoiceId: string) {
  expect((await checkout(invoiceId)).status).toBe(200);
  const session = await storedSession(invoiceId);
  expect((await payOnFake(session.stripeSessionId, '4242 4242 4242 4242')).status).toBe(200);
  expect((await deliver(await fakeEvent('checkout.session.completed', session.stripeSessionId))).status).toBe(200);
  const intentId = (await stripe.checkout.sessions.retrieve(session.stripeSessionId)).payment_intent as string;
  const [payment] = await paymentsOf(invoiceId);
  expect(payment).toMatchObject({ method: 'card', stripePaymentIntentId: intentId });
  return { session, intentId, payment: payment! };
}

const refundPayment = (invoiceId: string, paymentId: string, body: object = {}, token = tokens.owner) =>
  t.http().post(`/api/invoices/${invoiceId}/payments/${paymentId}/refund`).set(bearer(token)).send(body);
const voidInvoice = (id: string) => t.http().post(`/api/invoices/${id}/void`).set(bearer(tokens.owner)).send({ reason: 'Billed to the wrong neighbour' });
const outcomeOf = async (eventId: string) => (await t.dbh.db.select().from(stripeEvents).where(eq(stripeEvents.id, eventId)))[0]?.outcome;

describe('voiding an invoice with a pay link out', () => {
  it('expires its open Checkout Session, so the old link can no longer take money', async () => {
    const invoice = await issuedInvoice();
    expect((await checkout(invoice.id)).status).toBe(200);
    const session = await storedSession(invoice.id);
    const voided = await voidInvoice(invoice.id);
    expect(voided.status).toBe(200);
    expect(voided.body.status).toBe('void');

    expect((await stripe.checkout.sessions.retrieve(session.stripeSessionId)).status).toBe('expired');
    expect((await storedSession(invoice.id)).status).toBe('expired');
    const stale = await payOnFake(session.stripeSessionId, '4242 4242 4242 4242');
    expect(stale.status).toBe(400);
    expect((await checkout(invoice.id)).status).toBe(409);
    expect(await paymentsOf(invoice.id)).toEqual([]);
  });

  it('is refused when the payer completed the checkout a moment before, and the payment then books normally', async () => {
    const invoice = await issuedInvoice();
    expect((await checkout(invoice.id)).status).toBe(200);
    const session = await storedSession(invoice.id);
    // Paid on Stripe; its event has not reached the API yet.
    expect((await payOnFake(session.stripeSessionId, '4242 4242 4242 4242')).status).toBe(200);
    const refused = await voidInvoice(invoice.id);
    expect(refused.status).toBe(409);
    expect(refused.body.message).toContain('card payment for this invoice has just been made');
    expect(await standing(invoice.id)).toMatchObject({ state: 'issued', balance: '210.00' });

    expect((await deliver(await fakeEvent('checkout.session.completed', session.stripeSessionId))).status).toBe(200);
    expect(await standing(invoice.id)).toMatchObject({ state: 'paid', balance: '0.00' });
    expect((await paymentsOf(invoice.id))[0]?.refundDue).toBeNull();
  });

  it('records a card payment that arrives for a void invoice as money to refund, flags it, and clears the flag once refunded', async () => {
    const invoice = await issuedInvoice();
    expect((await checkout(invoice.id)).status).toBe(200);
    const session = await storedSession(invoice.id);
    expect((await payOnFake(session.stripeSessionId, '4242 4242 4242 4242')).status).toBe(200);
    // A session the server no longer counted as open (as after a lost answer from Stripe), so the void went through.
    await t.dbh.db.update(checkoutSessions).set({ status: 'expired' }).where(eq(checkoutSessions.id, session.id));
    expect((await voidInvoice(invoice.id)).status).toBe(200);

    const completed = await fakeEvent('checkout.session.completed', session.stripeSessionId);
    expect((await deliver(completed)).status).toBe(200);
    expect(await outcomeOf(completed.id)).toBe('payment recorded: refund due to the payer');
    const [payment] = await paymentsOf(invoice.id);
    expect(payment).toMatchObject({ amount: '210.00', amountRefunded: '0.00', refundDue: 'Paid by card after the invoice was voided; refund it to the payer.' });
    const listed = await t.http().get(`/api/invoices/${invoice.id}/payments`).set(bearer(tokens.owner));
    expect(listed.body[0]).toMatchObject({ refundDue: 'Paid by card after the invoice was voided; refund it to the payer.', amountRefunded: '0.00' });
    const flagged = await t.dbh.db.select().from(auditLog).where(eq(auditLog.entityId, invoice.id));
    expect(flagged.map((a) => a.action)).toContain('payment.card-overpaid');
    const detail = await t.http().get(`/api/invoices/${invoice.id}`).set(bearer(tokens.owner));
    expect(detail.body).toMatchObject({ status: 'void', state: 'void' });

    const refunded = await refundPayment(invoice.id, payment!.id);
    expect(refunded.status).toBe(200);
    expect(refunded.body.payment).toMatchObject({ amountRefunded: '210.00', status: 'refunded', refundDue: null });
    const intent = await stripe.paymentIntents.retrieve(payment!.stripePaymentIntentId!, { expand: ['latest_charge'] });
    expect((intent.latest_charge as Stripe.Charge).amount_refunded).toBe(21000);
  });
});

describe('a balance that changes while a pay link is out', () => {
  it('expires the link when a cheque is recorded or a credit note issued, and the next checkout asks for the new balance', async () => {
    const invoice = await issuedInvoice();
    expect((await checkout(invoice.id)).status).toBe(200);
    const first = await storedSession(invoice.id);
    const cheque = await t.http().post(`/api/invoices/${invoice.id}/payments`).set(bearer(tokens.owner)).send({ method: 'cheque', amount: '60', receivedOn: '2025-05-20' });
    expect(cheque.status).toBe(201);
    expect((await stripe.checkout.sessions.retrieve(first.stripeSessionId)).status).toBe('expired');
    expect((await payOnFake(first.stripeSessionId, '4242 4242 4242 4242')).status).toBe(400);

    const again = await checkout(invoice.id);
    expect(again.body.amount).toBe('150.00');
    const second = (await t.dbh.db.select().from(checkoutSessions).where(eq(checkoutSessions.invoiceId, invoice.id))).find((s) => s.status === 'open')!;
    expect(second.amountCents).toBe(15000);
    const credited = await t.http().post(`/api/invoices/${invoice.id}/credit-notes`).set(bearer(tokens.owner)).send({ reason: 'Rained off', lines: [{ description: 'Rained off', amount: '50.00' }] });
    expect(credited.status).toBe(201);
    expect((await stripe.checkout.sessions.retrieve(second.stripeSessionId)).status).toBe('expired');
    const statuses = (await t.dbh.db.select().from(checkoutSessions).where(eq(checkoutSessions.invoiceId, invoice.id))).map((s) => s.status);
    expect(statuses).toEqual(['expired', 'expired']);
    expect((await checkout(invoice.id)).body.amount).toBe('100.00');
  });
});

describe('refunds of card payments', () => {
  it('lets the owner refund part and then the rest; the invoice goes from paid to partly paid to open', async () => {
    const invoice = await issuedInvoice();
    const { payment, intentId } = await paidByCard(invoice.id);
    expect(await standing(invoice.id)).toMatchObject({ state: 'paid' });

    const part = await refundPayment(invoice.id, payment.id, { amount: '60.00', reason: 'Ten acres were not mown' });
    expect(part.status).toBe(200);
    expect(part.body.payment).toMatchObject({ amountRefunded: '60.00', status: 'succeeded' });
    expect(part.body.invoice).toMatchObject({ state: 'partly-paid', balance: '60.00', amountPaid: '150.00' });
    const [row] = await t.dbh.db.select().from(paymentRefunds).where(eq(paymentRefunds.paymentId, payment.id));
    expect(row).toMatchObject({ amount: '60.00', reason: 'Ten acres were not mown' });
    expect(await stripe.refunds.retrieve(row!.stripeRefundId)).toMatchObject({ amount: 6000, payment_intent: intentId, status: 'succeeded' });

    // Stripe's own events about this refund find it booked and change nothing.
    const created = await fakeEvent('refund.created', row!.stripeRefundId);
    expect((await deliver(created)).status).toBe(200);
    expect(await outcomeOf(created.id)).toBe('refund already recorded');
    const charge = (await stripe.paymentIntents.retrieve(intentId)).latest_charge as string;
    const chargeRefunded = await fakeEvent('charge.refunded', charge);
    expect((await deliver(chargeRefunded)).status).toBe(200);
    expect(await outcomeOf(chargeRefunded.id)).toBe('refunds all recorded');
    expect(await standing(invoice.id)).toMatchObject({ state: 'partly-paid', balance: '60.00' });

    const tooMuch = await refundPayment(invoice.id, payment.id, { amount: '150.01' });
    expect(tooMuch.status).toBe(400);
    expect(tooMuch.body.issues[0]).toMatchObject({ path: 'amount', message: 'At most the 150.00 not yet refunded of this payment.' });
    const rest = await refundPayment(invoice.id, payment.id);
    expect(rest.status).toBe(200);
    expect(rest.body.payment).toMatchObject({ amountRefunded: '210.00', status: 'refunded' });
    expect(rest.body.invoice).toMatchObject({ state: 'issued', balance: '210.00', amountPaid: '0.00' });
    expect((await refundPayment(invoice.id, payment.id)).status).toBe(409);
  });

  it('books a refund made on Stripe itself from its signed event, once, however often it arrives', async () => {
    const invoice = await issuedInvoice();
    const { payment, intentId } = await paidByCard(invoice.id);
    const refund = await stripe.refunds.create({ payment_intent: intentId, amount: 5000 });
    const event = await fakeEvent('refund.created', refund.id);
    const forged = await deliver(event, { secret: 'whsec_not_the_endpoint_secret' });
    expect(forged.status).toBe(400);
    expect(await standing(invoice.id)).toMatchObject({ state: 'paid' });

    const copies = await Promise.all([deliver(event), deliver(event), deliver({ ...event, id: testStripeId('evt') })]);
    expect(copies.map((c) => c.status)).toEqual([200, 200, 200]);
    expect(await t.dbh.db.select().from(paymentRefunds).where(eq(paymentRefunds.paymentId, payment.id))).toHaveLength(1);
    expect((await paymentsOf(invoice.id))[0]).toMatchObject({ amountRefunded: '50.00', status: 'succeeded' });
    expect(await standing(invoice.id)).toMatchObject({ state: 'partly-paid', balance: '50.00', amountPaid: '160.00' });
  });

  it('refuses other roles, manual payments, and another operation’s payment', async () => {
    const invoice = await issuedInvoice();
    const { payment } = await paidByCard(invoice.id);
    for (const role of ['partner', 'bookkeeper', 'customer', 'operator'] as const) expect((await refundPayment(invoice.id, payment.id, {}, tokens[role])).status, role).toBe(403);

    const cheque = await issuedInvoice();
    const recorded = await t.http().post(`/api/invoices/${cheque.id}/payments`).set(bearer(tokens.owner)).send({ method: 'cheque', amount: '10', receivedOn: '2025-05-20' });
    expect((await refundPayment(cheque.id, recorded.body.payment.id)).status).toBe(409);
    expect((await refundPayment(cheque.id, payment.id)).status).toBe(404);

    const elsewhere = await createOperation(t.dbh.db, 'Another outfit');
    const theirs = await signInAll(t, elsewhere);
    expect((await refundPayment(invoice.id, payment.id, {}, theirs.owner)).status).toBe(404);
    expect((await refundPayment(invoice.id, payment.id, { amount: '-5' })).status).toBe(400);
    expect((await paymentsOf(invoice.id))[0]).toMatchObject({ amountRefunded: '0.00', status: 'succeeded' });
  });
});
