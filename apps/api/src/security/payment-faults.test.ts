import { and, eq } from 'drizzle-orm';
import Stripe from 'stripe';
import { auditLog, checkoutSessions, paymentRefunds, payments, stripeEvents } from '@hitchbook/db';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addEntry, addNeighbourSheet, createBillingWorld, type BillingWorld } from '../modules/invoices/billing-world.fixture.js';
import { createOperation, signInAll, type OperationFixture } from '../test-support/fixtures.js';
import { completedSessionEvent, testStripeId } from '../test-support/stripe-events.js';
import { TcpProxy } from '../test-support/tcp-proxy.js';
import { createTestApp, type TestApp } from '../test-support/test-app.js';

/**
 * Card payments when Stripe is away or its events arrive in an order the happy path never sees.
 * The API reaches the Stripe fake through a relay that the tests cut and restore.
 */

let t: TestApp;
let relay: TcpProxy;
let stripe: Stripe;
let webhookSecret: string;
let world: BillingWorld<OperationFixture>;
let tokens: Awaited<ReturnType<typeof signInAll>>;
let day = 0;
let fakeUrl: string;
const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });
const eventId = () => testStripeId('evt');

beforeAll(async () => {
  const url = process.env.STRIPE_FAKE_URL;
  if (!url) throw new Error('STRIPE_FAKE_URL is not set: run the tests through `npm test`, which starts the Stripe fake.');
  fakeUrl = url.replace(/\/$/, '');
  const fake = new URL(url);
  relay = new TcpProxy(fake.hostname, Number(fake.port));
  await relay.open();
  const base = await createTestApp();
  const stripeConfig = base.config.stripe;
  await base.close();
  if (!stripeConfig) throw new Error('STRIPE_SECRET_KEY and STRIPE_WEBHOOK_SECRET are not set: run the tests through `npm test`.');
  t = await createTestApp({ stripe: { ...stripeConfig, host: '127.0.0.1', port: relay.port, protocol: 'http' } });
  webhookSecret = stripeConfig.webhookSecret;
  stripe = new Stripe(stripeConfig.secretKey, { host: fake.hostname, port: Number(fake.port), protocol: 'http', maxNetworkRetries: 0 });
  world = await createBillingWorld(t.dbh.db, await createOperation(t.dbh.db, 'Card faults outfit'));
  await addNeighbourSheet(t.dbh.db, world);
  tokens = await signInAll(t, world.fx);
});
afterAll(async () => {
  await t?.close();
  await relay?.cut();
});

/** 10 acres of mowing for the neighbour, issued: 185.00 + 25.00 travel = 210.00. */
async function issuedInvoice(): Promise<string> {
  const workDate = `2025-07-${String(++day).padStart(2, '0')}`;
  await addEntry(t.dbh.db, world, { workDate, workTypeId: world.workTypes.mowing, fieldId: world.fields.creekBottom, billToPartyId: world.fx.customers[0], hours: '2.00', acres: '10.000' });
  const draft = await t.http().post('/api/invoices/drafts').set(bearer(tokens.owner)).send({ partyId: world.fx.customers[0], from: workDate, to: workDate });
  const issued = await t.http().post(`/api/invoices/${draft.body.id}/issue`).set(bearer(tokens.owner)).send({});
  expect(issued.status).toBe(200);
  return issued.body.id as string;
}

const checkout = (invoiceId: string) => t.http().post(`/api/invoices/${invoiceId}/checkout`).set(bearer(tokens.customer)).send({});
const standing = async (id: string) => (await t.http().get(`/api/invoices/${id}`).set(bearer(tokens.owner))).body as { state: string; balance: string };
const sessionsOf = (invoiceId: string) => t.dbh.db.select().from(checkoutSessions).where(eq(checkoutSessions.invoiceId, invoiceId));

function deliver(event: object) {
  const payload = JSON.stringify(event, null, 2);
  const signature = stripe.webhooks.generateTestHeaderString({ payload, secret: webhookSecret });
  return t.http().post('/api/payments/stripe-webhook').set('Content-Type', 'application/json').set('Stripe-Signature', signature).send(payload);
}

async function fakeEvent(type: string, objectId: string): Promise<Stripe.Event> {
  const list = (await (await fetch(`${fakeUrl}/_fake/events?type=${type}&object=${objectId}`)).json()) as { data: Array<{ id: string }> };
  expect(list.data.length, `${type} for ${objectId}`).toBeGreaterThan(0);
  return stripe.events.retrieve(list.data[0]!.id);
}


describe('Stripe unreachable', () => {
  it('answers a clear 503 to the payer, writes nothing, and opens the checkout once Stripe is back', async () => {
    const invoiceId = await issuedInvoice();
    await relay.cut();
    try {
      const res = await checkout(invoiceId);
      expect(res.status).toBe(503);
      expect(res.body).toEqual({ message: 'Card payments are unavailable right now; try again shortly.' });
      expect(await sessionsOf(invoiceId)).toEqual([]);
      const audit = await t.dbh.db.select().from(auditLog).where(and(eq(auditLog.entityId, invoiceId), eq(auditLog.action, 'checkout.opened')));
      expect(audit).toEqual([]);
      expect(await standing(invoiceId)).toMatchObject({ state: 'issued', balance: '210.00' });
    } finally {
      await relay.open();
    }
    const again = await checkout(invoiceId);
    expect(again.status).toBe(200);
    expect(again.body.amount).toBe('210.00');
    expect(await sessionsOf(invoiceId)).toHaveLength(1);
  });
});

describe('events out of order', () => {
  it('books nothing for payment_intent events that come before the completed session, then books the payment once', async () => {
    const invoiceId = await issuedInvoice();
    expect((await checkout(invoiceId)).status).toBe(200);
    const [session] = await sessionsOf(invoiceId);
    const intent = testStripeId('pi');
    const early = [
      { id: eventId(), object: 'event', type: 'payment_intent.created', created: Math.floor(Date.now() / 1000), data: { object: { id: intent, object: 'payment_intent', amount: 21000, currency: 'usd', status: 'requires_payment_method' } } },
      { id: eventId(), object: 'event', type: 'payment_intent.succeeded', created: Math.floor(Date.now() / 1000), data: { object: { id: intent, object: 'payment_intent', amount: 99999, currency: 'usd', status: 'succeeded', metadata: { invoiceId } } } },
      { ...completedSessionEvent(session!, { payment_intent: intent }), type: 'checkout.session.async_payment_failed' },
    ];
    for (const e of early) expect((await deliver(e)).status).toBe(200);
    expect(await t.dbh.db.select().from(payments).where(eq(payments.invoiceId, invoiceId))).toEqual([]);
    expect(await standing(invoiceId)).toMatchObject({ state: 'issued', balance: '210.00' });

    expect((await deliver(completedSessionEvent(session!, { payment_intent: intent }))).status).toBe(200);
    expect((await deliver(completedSessionEvent(session!, { payment_intent: intent }))).status).toBe(200);
    const booked = await t.dbh.db.select().from(payments).where(eq(payments.invoiceId, invoiceId));
    expect(booked).toHaveLength(1);
    expect(booked[0]).toMatchObject({ amount: '210.00', stripePaymentIntentId: intent });
    expect(await standing(invoiceId)).toMatchObject({ state: 'paid', balance: '0.00' });
  });

  it('keeps a refund whose event comes before the payment it refunds, and books it once the payment is in', async () => {
    const invoiceId = await issuedInvoice();
    expect((await checkout(invoiceId)).status).toBe(200);
    const [session] = await sessionsOf(invoiceId);
    const paid = await fetch(`${fakeUrl}/_fake/checkout/sessions/${session!.stripeSessionId}/pay`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json' },
      body: JSON.stringify({ card_number: '4242 4242 4242 4242', exp_month: 12, exp_year: 2040, cvc: '123' }),
    });
    expect(paid.status).toBe(200);
    const intent = (await stripe.checkout.sessions.retrieve(session!.stripeSessionId)).payment_intent as string;
    const refund = await stripe.refunds.create({ payment_intent: intent, amount: 5000 });
    const refundEvent = await fakeEvent('refund.created', refund.id);

    // Not booked yet: the API says so with a status Stripe retries, and keeps no record of the event.
    const early = await deliver(refundEvent);
    expect(early.status).toBe(503);
    expect(await t.dbh.db.select().from(stripeEvents).where(eq(stripeEvents.id, refundEvent.id))).toEqual([]);
    expect(await standing(invoiceId)).toMatchObject({ state: 'issued', balance: '210.00' });

    expect((await deliver(await fakeEvent('checkout.session.completed', session!.stripeSessionId))).status).toBe(200);
    // Stripe's retry of the same event.
    expect((await deliver(refundEvent)).status).toBe(200);
    const [payment] = await t.dbh.db.select().from(payments).where(eq(payments.invoiceId, invoiceId));
    expect(payment).toMatchObject({ amountRefunded: '50.00', stripePaymentIntentId: intent });
    expect(await t.dbh.db.select().from(paymentRefunds).where(eq(paymentRefunds.paymentId, payment!.id))).toHaveLength(1);
    expect(await standing(invoiceId)).toMatchObject({ state: 'partly-paid', balance: '50.00' });
  });

  it('ignores a refund for a payment intent no checkout of ours ever opened', async () => {
    const refund = {
      id: eventId(),
      object: 'event',
      type: 'refund.created',
      created: Math.floor(Date.now() / 1000),
      data: { object: { id: testStripeId('re'), object: 'refund', amount: 5000, currency: 'usd', status: 'succeeded', payment_intent: 'pi_test_from_elsewhere', reason: null } },
    };
    expect((await deliver(refund)).status).toBe(200);
    const [recorded] = await t.dbh.db.select().from(stripeEvents).where(eq(stripeEvents.id, refund.id));
    expect(recorded?.outcome).toBe('refund of a payment not recorded here');
  });
});
