import Stripe from 'stripe';
import { describe, expect, it } from 'vitest';
import { control, createInvoiceSession, eventually, payWithCard, sdkFor, startFake, startReceiver } from './test-support/harness.js';

describe('PaymentIntents', () => {
  it('charges pm_card_visa on confirm and records the succeeded charge', async () => {
    const stripe = sdkFor(await startFake());
    const created = await stripe.paymentIntents.create({ amount: 87500, currency: 'CAD', metadata: { invoiceId: 'inv_3' }, description: 'Invoice 2026-003' });
    expect(created).toMatchObject({ object: 'payment_intent', status: 'requires_payment_method', amount: 87500, currency: 'cad', latest_charge: null });
    expect(created.id).toMatch(/^pi_/);
    expect(created.client_secret).toMatch(new RegExp(`^${created.id}_secret_`));

    const confirmed = await stripe.paymentIntents.confirm(created.id, { payment_method: 'pm_card_visa' });
    expect(confirmed).toMatchObject({ status: 'succeeded', amount_received: 87500, last_payment_error: null });
    expect(confirmed.payment_method).toMatch(/^pm_/);
    const charge = await stripe.charges.retrieve(confirmed.latest_charge as string);
    expect(charge).toMatchObject({ id: expect.stringMatching(/^ch_/), status: 'succeeded', amount: 87500, currency: 'cad', metadata: { invoiceId: 'inv_3' } });
    expect(await stripe.paymentIntents.retrieve(created.id)).toMatchObject({ status: 'succeeded' });
  });

  it('declines pm_card_chargeDeclined with a 402 StripeCardError and takes another card afterwards', async () => {
    const stripe = sdkFor(await startFake());
    const intent = await stripe.paymentIntents.create({ amount: 1200, currency: 'usd' });
    const error = (await stripe.paymentIntents.confirm(intent.id, { payment_method: 'pm_card_chargeDeclined' }).catch((e: unknown) => e)) as Stripe.errors.StripeCardError;

    expect(error).toBeInstanceOf(Stripe.errors.StripeCardError);
    expect(error).toMatchObject({ statusCode: 402, code: 'card_declined', decline_code: 'generic_decline', message: 'Your card was declined.' });
    expect(error.charge).toMatch(/^ch_/);
    expect(error.payment_intent).toMatchObject({ id: intent.id, status: 'requires_payment_method' });
    const failed = await stripe.paymentIntents.retrieve(intent.id);
    expect(failed.last_payment_error).toMatchObject({ type: 'card_error', code: 'card_declined', decline_code: 'generic_decline', charge: error.charge });

    const retried = await stripe.paymentIntents.confirm(intent.id, { payment_method: 'pm_card_mastercard' });
    expect(retried).toMatchObject({ status: 'succeeded', last_payment_error: null });
    expect(retried.latest_charge).not.toBe(error.charge);
  });

  it('refuses to confirm an intent that has already succeeded', async () => {
    const stripe = sdkFor(await startFake());
    const intent = await stripe.paymentIntents.create({ amount: 1200, currency: 'usd', payment_method: 'pm_card_visa', confirm: true });
    expect(intent.status).toBe('succeeded');
    await expect(stripe.paymentIntents.confirm(intent.id, { payment_method: 'pm_card_visa' })).rejects.toMatchObject({
      statusCode: 400,
      code: 'payment_intent_unexpected_state',
      message: expect.stringContaining('because it has a status of succeeded'),
    });
  });

  it('cancels an unpaid intent with its reason and sends payment_intent.canceled', async () => {
    const receiver = await startReceiver();
    const stripe = sdkFor(await startFake({ webhookUrl: receiver.url }));
    const intent = await stripe.paymentIntents.create({ amount: 1200, currency: 'usd' });
    const canceled = await stripe.paymentIntents.cancel(intent.id, { cancellation_reason: 'requested_by_customer' });
    expect(canceled).toMatchObject({ status: 'canceled', cancellation_reason: 'requested_by_customer' });
    expect(canceled.canceled_at).toBeGreaterThan(0);
    await eventually(() => receiver.ofType('payment_intent.canceled')[0]);
    await expect(stripe.paymentIntents.cancel(intent.id)).rejects.toMatchObject({ code: 'payment_intent_unexpected_state' });
  });

  it('leaves the intents Checkout creates to their session', async () => {
    const fake = await startFake();
    const stripe = sdkFor(fake);
    const session = await createInvoiceSession(stripe);
    await payWithCard(fake, session.id, '4000000000000002');
    const { payment_intent } = await stripe.checkout.sessions.retrieve(session.id);
    await expect(stripe.paymentIntents.cancel(payment_intent as string)).rejects.toMatchObject({ statusCode: 400, message: expect.stringContaining('Expire Checkout Session') });
    await expect(stripe.paymentIntents.confirm(payment_intent as string, { payment_method: 'pm_card_visa' })).rejects.toMatchObject({ statusCode: 400 });
  });

  it('answers an unknown PaymentMethod with 404 resource_missing', async () => {
    const stripe = sdkFor(await startFake());
    const intent = await stripe.paymentIntents.create({ amount: 1200, currency: 'usd' });
    await expect(stripe.paymentIntents.confirm(intent.id, { payment_method: 'pm_card_nonsense' })).rejects.toMatchObject({
      statusCode: 404,
      code: 'resource_missing',
      param: 'payment_method',
    });
  });

  it.each([
    [{ amount: 0, currency: 'usd' }, 'amount must be greater than or equal to 1.'],
    [{ amount: 1200 } as Stripe.PaymentIntentCreateParams, 'Missing required param: currency.'],
    [{ amount: 1200, currency: 'dollars' }, 'Invalid currency: dollars.'],
  ])('refuses %j', async (params, message) => {
    const stripe = sdkFor(await startFake());
    await expect(stripe.paymentIntents.create(params)).rejects.toMatchObject({ statusCode: 400, message: expect.stringContaining(message) });
  });
});

describe('refunds', () => {
  async function paidInvoice() {
    const receiver = await startReceiver();
    const fake = await startFake({ webhookUrl: receiver.url });
    const stripe = sdkFor(fake);
    const session = await createInvoiceSession(stripe);
    const paid = await payWithCard(fake, session.id, '4242424242424242');
    return { fake, stripe, receiver, intentId: paid.body.payment_intent.id as string };
  }

  it('refunds part of a payment, then the rest, and refuses more than what is left', async () => {
    const { stripe, intentId } = await paidInvoice();
    const part = await stripe.refunds.create({ payment_intent: intentId, amount: 40050, reason: 'requested_by_customer', metadata: { creditNote: 'cn_1' } });
    expect(part).toMatchObject({ object: 'refund', amount: 40050, currency: 'usd', status: 'succeeded', payment_intent: intentId, reason: 'requested_by_customer', metadata: { creditNote: 'cn_1' } });
    expect(part.id).toMatch(/^re_/);

    const tooMuch = await stripe.refunds.create({ payment_intent: intentId, amount: 84001 }).catch((e: unknown) => e);
    expect(tooMuch).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect(tooMuch).toMatchObject({
      statusCode: 400,
      code: 'amount_too_large',
      param: 'amount',
      message: 'Refund amount (840.01 USD) is greater than unrefunded amount on charge (840.00 USD)',
    });

    const rest = await stripe.refunds.create({ payment_intent: intentId });
    expect(rest.amount).toBe(84000);
    const charge = await stripe.charges.retrieve(rest.charge as string);
    expect(charge).toMatchObject({ amount_refunded: 124050, refunded: true });
    await expect(stripe.refunds.create({ payment_intent: intentId, amount: 1 })).rejects.toMatchObject({ code: 'charge_already_refunded' });
    expect(await stripe.refunds.retrieve(part.id)).toMatchObject({ id: part.id, amount: 40050 });
  });

  it('sends refund.created and charge.refunded for each refund', async () => {
    const { stripe, receiver, intentId } = await paidInvoice();
    const refund = await stripe.refunds.create({ payment_intent: intentId, amount: 5000 });
    const created = await eventually(() => receiver.ofType('refund.created')[0]);
    const refunded = await eventually(() => receiver.ofType('charge.refunded')[0]);
    expect(JSON.parse(created.rawBody).data.object).toMatchObject({ id: refund.id, amount: 5000 });
    expect(JSON.parse(refunded.rawBody).data.object).toMatchObject({ id: refund.charge, amount_refunded: 5000, refunded: false });
  });

  it('refuses to refund a payment that has not succeeded, and an unknown one', async () => {
    const stripe = sdkFor(await startFake());
    const unpaid = await stripe.paymentIntents.create({ amount: 1200, currency: 'usd' });
    await expect(stripe.refunds.create({ payment_intent: unpaid.id })).rejects.toMatchObject({ statusCode: 400, message: expect.stringContaining('does not have a successful charge') });
    await expect(stripe.refunds.create({ payment_intent: 'pi_missing' })).rejects.toMatchObject({ statusCode: 404, code: 'resource_missing' });
    await expect(stripe.refunds.retrieve('re_missing')).rejects.toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    await expect(stripe.refunds.create({})).rejects.toMatchObject({ statusCode: 400, code: 'parameter_missing' });
  });

  it('keeps the refund amount in whole cents', async () => {
    const { fake, intentId } = await paidInvoice();
    const res = await fetch(`${fake.url}/v1/refunds`, {
      method: 'POST',
      headers: { authorization: 'Bearer sk_test_x', 'content-type': 'application/x-www-form-urlencoded' },
      body: `payment_intent=${intentId}&amount=10.5`,
    });
    expect(res.status).toBe(400);
    expect((await control(fake, 'GET', '/events?type=refund.created')).body.data).toEqual([]);
  });
});
