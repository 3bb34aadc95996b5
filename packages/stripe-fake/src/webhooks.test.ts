import { createServer, type AddressInfo } from 'node:net';
import Stripe from 'stripe';
import { describe, expect, it } from 'vitest';
import { control, createInvoiceSession, eventually, payWithCard, sdkFor, startFake, startReceiver, WEBHOOK_SECRET } from './test-support/harness.js';
import type { DeliveryAttempt } from './index.js';

const verifier = new Stripe('sk_test_verifier');

function attemptsOf(fake: { url: string }, eventId: string) {
  return fetch(`${fake.url}/_fake/webhook-attempts?event=${eventId}`).then(async (r) => ((await r.json()) as { data: DeliveryAttempt[] }).data);
}

describe('signed webhooks', () => {
  it('sends checkout.session.completed after a 4242 payment, signed so constructEvent accepts it', async () => {
    const receiver = await startReceiver();
    const fake = await startFake({ webhookUrl: receiver.url });
    const stripe = sdkFor(fake);
    const session = await createInvoiceSession(stripe);

    const paid = await payWithCard(fake, session.id, '4242 4242 4242 4242');
    expect(paid.status).toBe(200);
    expect(paid.body.checkout_session).toMatchObject({ status: 'complete', payment_status: 'paid' });
    const delivery = await eventually(() => receiver.ofType('checkout.session.completed')[0]);

    expect(delivery.headers['content-type']).toBe('application/json; charset=utf-8');
    expect(delivery.headers['stripe-signature']).toMatch(/^t=\d+,v1=[0-9a-f]{64}$/);
    const event = verifier.webhooks.constructEvent(delivery.rawBody, delivery.headers['stripe-signature'] as string, WEBHOOK_SECRET);
    expect(event.type).toBe('checkout.session.completed');
    const object = event.data.object as Stripe.Checkout.Session;
    expect(object).toMatchObject({ id: session.id, payment_status: 'paid', amount_total: 124050, currency: 'usd', metadata: { invoiceId: 'inv_14', operationId: 'op_7' } });
    expect(object.payment_intent).toBe(paid.body.payment_intent.id);
    expect(event).toMatchObject({ object: 'event', livemode: false, api_version: '2026-10-28.endive', request: { id: null, idempotency_key: null } });

    const fetched = await stripe.events.retrieve(event.id);
    expect(fetched).toMatchObject({ id: event.id, type: 'checkout.session.completed', pending_webhooks: 0 });
    const succeeded = await eventually(() => receiver.ofType('payment_intent.succeeded')[0]);
    expect(JSON.parse(succeeded.rawBody).data.object).toMatchObject({ id: object.payment_intent, status: 'succeeded', metadata: { invoiceId: 'inv_14' } });
  });

  it('is refused by constructEvent under another secret or after one byte of the body changes', async () => {
    const receiver = await startReceiver();
    const fake = await startFake({ webhookUrl: receiver.url });
    await payWithCard(fake, (await createInvoiceSession(sdkFor(fake))).id, '4242424242424242');
    const delivery = await eventually(() => receiver.ofType('checkout.session.completed')[0]);
    const header = delivery.headers['stripe-signature'] as string;

    expect(() => verifier.webhooks.constructEvent(delivery.rawBody, header, 'whsec_someone_else')).toThrow(Stripe.errors.StripeSignatureVerificationError);
    const reserialised = JSON.stringify(JSON.parse(delivery.rawBody));
    expect(() => verifier.webhooks.constructEvent(reserialised, header, WEBHOOK_SECRET)).toThrow(Stripe.errors.StripeSignatureVerificationError);
  });

  it('sends payment_intent.payment_failed for a declined card', async () => {
    const receiver = await startReceiver();
    const fake = await startFake({ webhookUrl: receiver.url });
    const session = await createInvoiceSession(sdkFor(fake));
    const declined = await payWithCard(fake, session.id, '4000000000009995');
    expect(declined.status).toBe(402);
    expect(declined.body.error).toMatchObject({ type: 'card_error', code: 'card_declined', decline_code: 'insufficient_funds', message: 'Your card has insufficient funds.' });

    const delivery = await eventually(() => receiver.ofType('payment_intent.payment_failed')[0]);
    const event = verifier.webhooks.constructEvent(delivery.rawBody, delivery.headers['stripe-signature'] as string, WEBHOOK_SECRET);
    expect((event.data.object as Stripe.PaymentIntent).last_payment_error).toMatchObject({ decline_code: 'insufficient_funds' });
    expect(receiver.ofType('checkout.session.completed')).toEqual([]);
  });

  it('retries an endpoint that answers 500 twice and records three attempts, the last delivered', async () => {
    const receiver = await startReceiver([500, 500]);
    const fake = await startFake({ webhookUrl: receiver.url, retrySchedule: [30, 30, 30, 30] });
    const intent = await sdkFor(fake).paymentIntents.create({ amount: 700, currency: 'usd' });
    await sdkFor(fake).paymentIntents.cancel(intent.id);
    const [event] = (await control(fake, 'GET', `/events?type=payment_intent.canceled`)).body.data;

    const attempts = await eventually(async () => {
      const list = await attemptsOf(fake, event.id);
      return list.length === 3 ? list : undefined;
    });
    expect(attempts.map((a) => [a.attempt, a.status, a.delivered])).toEqual([
      [1, 500, false],
      [2, 500, false],
      [3, 200, true],
    ]);
    expect(attempts[0]!.response_body).toBe('endpoint refused it');
    expect(receiver.received.filter((r) => JSON.parse(r.rawBody).id === event.id)).toHaveLength(3);
    expect((await control(fake, 'GET', `/events?type=payment_intent.canceled`)).body.data[0].delivery).toBe('delivered');
  });

  it('signs every retry afresh with the time of that attempt', async () => {
    const receiver = await startReceiver([500]);
    const fake = await startFake({ webhookUrl: receiver.url, retrySchedule: [1100] });
    const intent = await sdkFor(fake).paymentIntents.create({ amount: 700, currency: 'usd' });
    await sdkFor(fake).paymentIntents.cancel(intent.id);
    await eventually(() => (receiver.received.length === 2 ? true : undefined), 4000);

    const [first, second] = receiver.received.map((r) => r.headers['stripe-signature'] as string);
    const timeOf = (header: string) => Number(/t=(\d+)/.exec(header)![1]);
    expect(timeOf(second!)).toBeGreaterThan(timeOf(first!));
    expect(second).not.toBe(first);
    expect(verifier.webhooks.constructEvent(receiver.received[1]!.rawBody, second!, WEBHOOK_SECRET).id).toBe(JSON.parse(receiver.received[0]!.rawBody).id);
  });

  it('gives up after the last retry of the schedule and marks the event failed', async () => {
    const receiver = await startReceiver([503, 503, 503]);
    const fake = await startFake({ webhookUrl: receiver.url, retrySchedule: [20, 20] });
    const intent = await sdkFor(fake).paymentIntents.create({ amount: 700, currency: 'usd' });
    await sdkFor(fake).paymentIntents.cancel(intent.id);

    const event = await eventually(async () => {
      const [e] = (await control(fake, 'GET', '/events')).body.data;
      return e?.delivery === 'failed' ? e : undefined;
    });
    expect(await attemptsOf(fake, event.id)).toHaveLength(3);
    await new Promise((resolve) => setTimeout(resolve, 100));
    expect(receiver.received).toHaveLength(3);
    expect((await sdkFor(fake).events.retrieve(event.id)).pending_webhooks).toBe(0);
  });

  it('counts an endpoint that is not listening as a failed attempt', async () => {
    const closed = createServer();
    await new Promise<void>((resolve) => closed.listen(0, '127.0.0.1', resolve));
    const port = (closed.address() as AddressInfo).port;
    await new Promise((resolve) => closed.close(resolve));
    const fake = await startFake({ webhookUrl: `http://127.0.0.1:${port}/api/payments/stripe-webhook`, retrySchedule: [] });
    const intent = await sdkFor(fake).paymentIntents.create({ amount: 700, currency: 'usd' });
    await sdkFor(fake).paymentIntents.cancel(intent.id);
    const [attempt] = await eventually(async () => {
      const list = (await control(fake, 'GET', '/webhook-attempts')).body.data as DeliveryAttempt[];
      return list.length > 0 ? list : undefined;
    });
    expect(attempt).toMatchObject({ status: null, delivered: false, error: 'ECONNREFUSED' });
  });

  it('resends an event with the same id and body, as a duplicate delivery', async () => {
    const receiver = await startReceiver();
    const fake = await startFake({ webhookUrl: receiver.url });
    await payWithCard(fake, (await createInvoiceSession(sdkFor(fake))).id, '4242424242424242');
    const original = await eventually(() => receiver.ofType('checkout.session.completed')[0]);
    const id = JSON.parse(original.rawBody).id as string;

    expect((await control(fake, 'POST', `/events/${id}/resend`)).body).toEqual({ resent: id });
    const copies = await eventually(() => (receiver.ofType('checkout.session.completed').length === 2 ? receiver.ofType('checkout.session.completed') : undefined));
    expect(copies[1]!.rawBody).toBe(original.rawBody);
    expect(verifier.webhooks.constructEvent(copies[1]!.rawBody, copies[1]!.headers['stripe-signature'] as string, WEBHOOK_SECRET).id).toBe(id);
    expect((await control(fake, 'POST', '/events/evt_missing/resend')).status).toBe(404);
  });

  it('holds events and releases them in the order asked for', async () => {
    const receiver = await startReceiver();
    const fake = await startFake({ webhookUrl: receiver.url });
    expect((await control(fake, 'POST', '/webhooks/hold')).body).toEqual({ held: true });
    await payWithCard(fake, (await createInvoiceSession(sdkFor(fake))).id, '4242424242424242');
    const events = (await control(fake, 'GET', '/events')).body.data as { id: string; type: string; delivery: string }[];
    expect(events.map((e) => [e.type, e.delivery])).toEqual([
      ['checkout.session.completed', 'held'],
      ['payment_intent.succeeded', 'held'],
    ]);
    expect(receiver.received).toEqual([]);

    const completed = events[0]!.id;
    const released = await control(fake, 'POST', '/webhooks/release', { order: [completed] });
    expect(released.body.released).toEqual([completed, events[1]!.id]);
    expect(receiver.received.map((r) => JSON.parse(r.rawBody).type)).toEqual(['checkout.session.completed', 'payment_intent.succeeded']);
    expect((await control(fake, 'POST', '/webhooks/release', { order: ['evt_unknown'] })).status).toBe(400);
  });

  it('keeps events without an endpoint and sends new ones once an endpoint is set', async () => {
    const fake = await startFake();
    const stripe = sdkFor(fake);
    const first = await stripe.paymentIntents.create({ amount: 700, currency: 'usd' });
    await stripe.paymentIntents.cancel(first.id);
    expect((await control(fake, 'GET', '/events')).body.data[0].delivery).toBe('no_endpoint');

    const receiver = await startReceiver();
    expect((await control(fake, 'PUT', '/webhook-endpoint', { url: receiver.url })).body).toEqual({ url: receiver.url, held: false });
    const second = await stripe.paymentIntents.create({ amount: 800, currency: 'usd' });
    await stripe.paymentIntents.cancel(second.id);
    const delivery = await eventually(() => receiver.received[0]);
    expect(verifier.webhooks.constructEvent(delivery.rawBody, delivery.headers['stripe-signature'] as string, WEBHOOK_SECRET).data.object).toMatchObject({ id: second.id });
    expect(receiver.received).toHaveLength(1);
  });

  it('refuses control requests that are not JSON, and unknown fields', async () => {
    const fake = await startFake();
    const form = await fetch(`${fake.url}/_fake/reset`, { method: 'POST', headers: { 'content-type': 'application/x-www-form-urlencoded' }, body: 'a=1' });
    expect(form.status).toBe(415);
    expect(((await form.json()) as { error: { type: string } }).error.type).toBe('invalid_request_error');
    const typo = await control(fake, 'PUT', '/webhook-endpoint', { uri: 'http://127.0.0.1:1/' });
    expect(typo).toMatchObject({ status: 400, body: { error: { message: 'Received unknown parameter: uri' } } });
  });
});
