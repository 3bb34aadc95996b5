import Stripe from 'stripe';
import { describe, expect, it } from 'vitest';
import { control, createInvoiceSession, errorOf, eventually, payWithCard, sdkFor, startFake, startReceiver } from './test-support/harness.js';

describe('Checkout Sessions through the Stripe SDK', () => {
  it('creates a session and reads it back with the typed fields the API relies on', async () => {
    const fake = await startFake();
    const stripe = sdkFor(fake);
    const created = await createInvoiceSession(stripe);

    expect(created.id).toMatch(/^cs_test_[A-Za-z0-9]{58}$/);
    expect(created.url).toBe(`${fake.url}/checkout/${created.id}`);
    const read: Stripe.Checkout.Session = await stripe.checkout.sessions.retrieve(created.id);
    expect(read).toMatchObject({
      id: created.id,
      object: 'checkout.session',
      mode: 'payment',
      status: 'open',
      payment_status: 'unpaid',
      currency: 'usd',
      amount_subtotal: 124050,
      amount_total: 124050,
      client_reference_id: 'inv_14',
      customer_email: 'customer@hitchbook.test',
      metadata: { invoiceId: 'inv_14', operationId: 'op_7' },
      payment_intent: null,
      livemode: false,
      success_url: 'http://localhost:3000/invoices/inv_14/paid?session={CHECKOUT_SESSION_ID}',
      cancel_url: 'http://localhost:3000/invoices/inv_14',
    });
    expect(read.created).toBeGreaterThan(Date.now() / 1000 - 60);
    expect(read.expires_at - read.created).toBe(24 * 60 * 60);
  });

  it('sums several line items in integer cents and expands them on request', async () => {
    const fake = await startFake();
    const stripe = sdkFor(fake);
    const created = await createInvoiceSession(stripe, {
      line_items: [
        { quantity: 3, price_data: { currency: 'usd', unit_amount: 3333, product_data: { name: 'Baling, per bale' } } },
        { quantity: 1, price_data: { currency: 'usd', unit_amount: 1, product_data: { name: 'Rounding' } } },
      ],
    });
    expect(created.amount_total).toBe(10000);
    const read = await stripe.checkout.sessions.retrieve(created.id, { expand: ['line_items'] });
    expect(read.line_items?.data.map((li) => [li.description, li.quantity, li.price?.unit_amount, li.amount_total])).toEqual([
      ['Baling, per bale', 3, 3333, 9999],
      ['Rounding', 1, 1, 1],
    ]);
  });

  it('expands the PaymentIntent and its charge once the session is paid', async () => {
    const fake = await startFake();
    const stripe = sdkFor(fake);
    const session = await createInvoiceSession(stripe);
    await payWithCard(fake, session.id, '4242424242424242');

    const read = await stripe.checkout.sessions.retrieve(session.id, { expand: ['payment_intent.latest_charge'] });
    const intent = read.payment_intent as Stripe.PaymentIntent;
    const charge = intent.latest_charge as Stripe.Charge;
    expect(intent).toMatchObject({ object: 'payment_intent', status: 'succeeded', amount: 124050, amount_received: 124050, metadata: { invoiceId: 'inv_14' } });
    expect(charge).toMatchObject({ object: 'charge', status: 'succeeded', paid: true, amount_captured: 124050, payment_intent: intent.id });
    expect(charge.payment_method_details?.card).toMatchObject({ brand: 'visa', last4: '4242' });
  });

  it('answers an unknown session id with a 404 resource_missing the SDK raises as StripeInvalidRequestError', async () => {
    const stripe = sdkFor(await startFake());
    const error = await stripe.checkout.sessions.retrieve('cs_test_missing').catch((e: unknown) => e);
    expect(error).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect(error).toMatchObject({ statusCode: 404, code: 'resource_missing', param: 'session', message: "No such checkout.session: 'cs_test_missing'" });
  });

  it.each([
    ['an unknown parameter', { locale_typo: 'en' }, 'Received unknown parameter: locale_typo', 'locale_typo'],
    ['no line items', { line_items: [] }, '`line_items` is required in `payment` mode.', 'line_items'],
    ['a subscription', { mode: 'subscription' }, 'Only mode=payment is supported here', 'mode'],
    ['a relative success URL', { success_url: '/paid' }, 'Not a valid URL: success_url must be an absolute http or https URL', 'success_url'],
    [
      'line items in two currencies',
      { line_items: [{ quantity: 1, price_data: { currency: 'usd', unit_amount: 100, product_data: { name: 'a' } } }, { quantity: 1, price_data: { currency: 'eur', unit_amount: 100, product_data: { name: 'b' } } }] },
      "All line items must be in the session's currency (usd); line_items[1] is in eur.",
      'line_items[1][price_data][currency]',
    ],
    [
      'a fractional unit amount',
      { line_items: [{ quantity: 1, price_data: { currency: 'usd', unit_amount: '12.50', product_data: { name: 'a' } } }] },
      'Invalid integer: 12.50',
      'line_items[0][price_data][unit_amount]',
    ],
    [
      "Stripe's retired amount and name line items",
      { line_items: [{ quantity: 1, amount: 100, currency: 'usd', name: 'x' }] },
      "line_items[0] uses amount/name, which Stripe's current API no longer accepts",
      'line_items[0][amount]',
    ],
  ])('refuses %s with a 400 naming the parameter', async (_case, overrides, message, param) => {
    const stripe = sdkFor(await startFake());
    const error = await createInvoiceSession(stripe, overrides as Partial<Stripe.Checkout.SessionCreateParams>).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect((error as Stripe.errors.StripeError).statusCode).toBe(400);
    expect((error as Stripe.errors.StripeError).message).toContain(message);
    expect((error as Stripe.errors.StripeError).param).toBe(param);
  });

  it('expires an open session once, sending checkout.session.expired, and refuses a second expiry', async () => {
    const receiver = await startReceiver();
    const fake = await startFake({ webhookUrl: receiver.url });
    const stripe = sdkFor(fake);
    const session = await createInvoiceSession(stripe);

    const expired = await stripe.checkout.sessions.expire(session.id);
    expect(expired).toMatchObject({ status: 'expired', url: null, payment_status: 'unpaid' });
    const delivered = await eventually(() => receiver.ofType('checkout.session.expired')[0]);
    expect(JSON.parse(delivered.rawBody).data.object).toMatchObject({ id: session.id, status: 'expired' });

    const again = await stripe.checkout.sessions.expire(session.id).catch((e: unknown) => e);
    expect(again).toMatchObject({ statusCode: 400, message: 'Only Checkout Sessions with a status in ["open"] can be expired.' });
    expect((await payWithCard(fake, session.id, '4242424242424242')).body.error.message).toBe('This Checkout Session is expired and can no longer be paid.');
  });

  it('refuses a key that is not a test-mode secret key with 401, which the SDK raises as StripeAuthenticationError', async () => {
    const fake = await startFake();
    const error = await sdkFor(fake, 'sk_live_hitchbook').checkout.sessions.retrieve('cs_test_x').catch((e: unknown) => e);
    expect(error).toBeInstanceOf(Stripe.errors.StripeAuthenticationError);
    expect((error as Stripe.errors.StripeError).statusCode).toBe(401);

    const anonymous = await fetch(`${fake.url}/v1/checkout/sessions/cs_test_x`);
    expect(anonymous.status).toBe(401);
    expect(await errorOf(anonymous)).toMatchObject({ type: 'invalid_request_error', message: expect.stringContaining('You did not provide an API key') });
  });

  it('accepts only the configured key when started with one', async () => {
    const fake = await startFake({ secretKey: 'sk_test_hitchbook_local' });
    await expect(sdkFor(fake, 'sk_test_someone_else').checkout.sessions.retrieve('cs_test_x')).rejects.toBeInstanceOf(Stripe.errors.StripeAuthenticationError);
    await expect(sdkFor(fake, 'sk_test_hitchbook_local').checkout.sessions.retrieve('cs_test_x')).rejects.toMatchObject({ statusCode: 404 });
  });

  it('refuses a JSON body, since Stripe takes form-encoded parameters', async () => {
    const fake = await startFake();
    const res = await fetch(`${fake.url}/v1/checkout/sessions`, {
      method: 'POST',
      headers: { authorization: 'Bearer sk_test_x', 'content-type': 'application/json' },
      body: JSON.stringify({ mode: 'payment' }),
    });
    expect(res.status).toBe(400);
    expect(await errorOf(res)).toMatchObject({ type: 'invalid_request_error', message: expect.stringContaining('form-encoded') });
  });

  it('answers an unknown endpoint with a 404 in the error shape', async () => {
    const fake = await startFake();
    const res = await fetch(`${fake.url}/v1/customers`, { headers: { authorization: 'Bearer sk_test_x' } });
    expect(res.status).toBe(404);
    expect(await errorOf(res)).toMatchObject({ type: 'invalid_request_error', message: expect.stringContaining('Unrecognized request URL (GET: /v1/customers)') });
  });

  it('forgets every session on reset', async () => {
    const fake = await startFake();
    const stripe = sdkFor(fake);
    const session = await createInvoiceSession(stripe);
    expect((await control(fake, 'POST', '/reset')).status).toBe(200);
    await expect(stripe.checkout.sessions.retrieve(session.id)).rejects.toMatchObject({ statusCode: 404, code: 'resource_missing' });
  });
});
