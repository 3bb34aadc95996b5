import { createHash } from 'node:crypto';
import Stripe from 'stripe';
import { describe, expect, it } from 'vitest';
import { control, createInvoiceSession, eventually, payWithCard, sdkFor, startFake, startReceiver, WEBHOOK_SECRET } from './test-support/harness.js';

const verifier = new Stripe('sk_test_verifier');
const nextYear = String((new Date().getUTCFullYear() + 1) % 100).padStart(2, '0');

function submit(url: string, fields: Record<string, string>) {
  return fetch(url, { method: 'POST', redirect: 'manual', headers: { 'content-type': 'application/x-www-form-urlencoded' }, body: new URLSearchParams(fields).toString() });
}

const card = (card_number: string, extra: Record<string, string> = {}) => ({ email: 'customer@hitchbook.test', card_number, expiry: `12 / ${nextYear}`, cvc: '123', ...extra });

describe('hosted checkout page', () => {
  it('shows the amount, the description and a card form under a strict policy of its own', async () => {
    const fake = await startFake();
    const session = await createInvoiceSession(sdkFor(fake));
    const res = await fetch(session.url!);
    const html = await res.text();

    expect(res.status).toBe(200);
    expect(html).toContain('1,240.50 USD');
    expect(html).toContain('Invoice 2026-014');
    expect(html).toContain('Combining, 40 ac at Miller north quarter');
    expect(html).toContain(`<form method="post" action="/checkout/${session.id}">`);
    for (const field of ['card_number', 'expiry', 'cvc', 'email']) expect(html).toContain(`name="${field}"`);
    expect(html).toContain('<a class="cancel" href="http://localhost:3000/invoices/inv_14">');
    expect(html).not.toMatch(/<script|<link|<img|src=/i);

    const policy = res.headers.get('content-security-policy')!;
    const style = /<style>([\s\S]*?)<\/style>/.exec(html)![1]!;
    expect(policy).toContain("default-src 'none'");
    expect(policy).toContain(`style-src 'sha256-${createHash('sha256').update(style).digest('base64')}'`);
    expect(policy).toContain("form-action 'self' http://localhost:3000;");
    expect(policy).toContain("frame-ancestors 'none'");
    expect(res.headers.get('x-content-type-options')).toBe('nosniff');
  });

  it('completes the session on 4242 and redirects to success_url with the session id filled in', async () => {
    const receiver = await startReceiver();
    const fake = await startFake({ webhookUrl: receiver.url });
    const stripe = sdkFor(fake);
    const session = await createInvoiceSession(stripe);

    const res = await submit(session.url!, card('4242 4242 4242 4242'));
    expect(res.status).toBe(303);
    expect(res.headers.get('location')).toBe(`http://localhost:3000/invoices/inv_14/paid?session=${session.id}`);

    const paid = await stripe.checkout.sessions.retrieve(session.id, { expand: ['payment_intent'] });
    expect(paid).toMatchObject({ status: 'complete', payment_status: 'paid', url: null, customer_details: { email: 'customer@hitchbook.test' } });
    expect(paid.payment_intent).toMatchObject({ status: 'succeeded', amount_received: 124050, latest_charge: expect.stringMatching(/^ch_/) });
    const delivery = await eventually(() => receiver.ofType('checkout.session.completed')[0]);
    const event = verifier.webhooks.constructEvent(delivery.rawBody, delivery.headers['stripe-signature'] as string, WEBHOOK_SECRET);
    expect(event.data.object).toMatchObject({ id: session.id, payment_status: 'paid' });

    const again = await fetch(session.url!);
    expect(again.status).toBe(410);
    expect(await again.text()).toContain('already been paid');
  });

  it('shows a decline on the page, leaves the session open and sends payment_intent.payment_failed', async () => {
    const receiver = await startReceiver();
    const fake = await startFake({ webhookUrl: receiver.url });
    const stripe = sdkFor(fake);
    const session = await createInvoiceSession(stripe);

    const res = await submit(session.url!, card('4000 0000 0000 0002'));
    expect(res.status).toBe(402);
    expect(await res.text()).toContain('<p class="error" role="alert">Your card was declined.</p>');
    expect(await stripe.checkout.sessions.retrieve(session.id)).toMatchObject({ status: 'open', payment_status: 'unpaid' });
    const failed = await eventually(() => receiver.ofType('payment_intent.payment_failed')[0]);
    expect(JSON.parse(failed.rawBody).data.object.last_payment_error).toMatchObject({ code: 'card_declined', decline_code: 'generic_decline' });

    expect((await submit(session.url!, card('4242424242424242'))).status).toBe(303);
    const completed = await stripe.checkout.sessions.retrieve(session.id);
    expect(completed.status).toBe('complete');
    expect(completed.payment_intent).toBe(JSON.parse(failed.rawBody).data.object.id);
  });

  it.each([
    ['a number failing the Luhn check', card('4242 4242 4242 4241'), 'Your card number is invalid.'],
    ['an expiry in the past', card('4242424242424242', { expiry: '01 / 20' }), "Your card's expiration date is in the past."],
    ['a short CVC', card('4242424242424242', { cvc: '12' }), "Your card's security code is incomplete."],
  ])('refuses %s before charging anything', async (_case, fields, message) => {
    const receiver = await startReceiver();
    const fake = await startFake({ webhookUrl: receiver.url });
    const stripe = sdkFor(fake);
    const session = await createInvoiceSession(stripe);

    const res = await submit(session.url!, fields);
    expect(res.status).toBe(402);
    expect(await res.text()).toContain(message.replace("'", '&#39;'));
    expect(await stripe.checkout.sessions.retrieve(session.id)).toMatchObject({ status: 'open', payment_intent: null });
    expect((await control(fake, 'GET', '/events')).body.data).toEqual([]);
  });

  it('says so at the URL of an expired session and of an unknown one', async () => {
    const fake = await startFake();
    const stripe = sdkFor(fake);
    const session = await createInvoiceSession(stripe);
    await stripe.checkout.sessions.expire(session.id);

    const expired = await fetch(`${fake.url}/checkout/${session.id}`);
    expect(expired.status).toBe(410);
    expect(await expired.text()).toContain('This checkout session has expired');
    const unknown = await fetch(`${fake.url}/checkout/cs_test_unknown`);
    expect(unknown.status).toBe(404);
    expect(await unknown.text()).toContain('Checkout session not found');
  });
});

describe('test cards', () => {
  it.each([
    ['4000000000000002', 'card_declined', 'generic_decline', 'Your card was declined.'],
    ['4000000000009995', 'card_declined', 'insufficient_funds', 'Your card has insufficient funds.'],
    ['4000000000000069', 'expired_card', 'expired_card', 'Your card has expired.'],
    ['4000000000000127', 'incorrect_cvc', 'incorrect_cvc', "Your card's security code is incorrect."],
    ['4242424242424241', 'invalid_number', undefined, 'Your card number is invalid.'],
    ['4111111111111111', 'card_declined', 'test_mode_live_card', expect.stringContaining('used a non test (live) card')],
  ])('%s fails with %s', async (number, code, declineCode, message) => {
    const fake = await startFake();
    const session = await createInvoiceSession(sdkFor(fake));
    const res = await payWithCard(fake, session.id, number);
    expect(res.status).toBe(402);
    expect(res.body.error).toMatchObject({ type: 'card_error', code, message });
    expect(res.body.error.decline_code).toBe(declineCode);
  });

  it.each([
    ['4242424242424242', 'visa'],
    ['5555555555554444', 'mastercard'],
    ['378282246310005', 'amex'],
  ])('%s succeeds as %s', async (number, brand) => {
    const fake = await startFake();
    const stripe = sdkFor(fake);
    const session = await createInvoiceSession(stripe);
    const res = await payWithCard(fake, session.id, number);
    expect(res.status).toBe(200);
    const charge = await stripe.charges.retrieve(res.body.payment_intent.latest_charge);
    expect(charge.payment_method_details?.card).toMatchObject({ brand, last4: number.slice(-4) });
  });
});
