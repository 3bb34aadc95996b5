import { request } from 'node:http';
import Stripe from 'stripe';
import { describe, expect, it } from 'vitest';
import { createInvoiceSession, sdkFor, startFake, TEST_KEY } from './test-support/harness.js';

describe('idempotency keys', () => {
  it('replays the first response for the same key and parameters, marked Idempotent-Replayed', async () => {
    const fake = await startFake();
    const stripe = sdkFor(fake);
    const first = await createInvoiceSession(stripe, {}, { idempotencyKey: 'checkout:op_7:inv_14:v1' });
    const second = await createInvoiceSession(stripe, {}, { idempotencyKey: 'checkout:op_7:inv_14:v1' });

    expect(second.id).toBe(first.id);
    expect(second.lastResponse.headers['idempotent-replayed']).toBe('true');
    expect(second.lastResponse.headers['original-request']).toBe(first.lastResponse.requestId);
    expect(first.lastResponse.headers['idempotent-replayed']).toBeUndefined();
    const other = await createInvoiceSession(stripe, {}, { idempotencyKey: 'checkout:op_7:inv_14:v2' });
    expect(other.id).not.toBe(first.id);
  });

  it('refuses the same key with other parameters as StripeIdempotencyError', async () => {
    const stripe = sdkFor(await startFake());
    await createInvoiceSession(stripe, {}, { idempotencyKey: 'same-key' });
    const error = await createInvoiceSession(stripe, { metadata: { invoiceId: 'inv_15' } }, { idempotencyKey: 'same-key' }).catch((e: unknown) => e);

    expect(error).toBeInstanceOf(Stripe.errors.StripeIdempotencyError);
    expect(error).toMatchObject({
      statusCode: 400,
      type: 'StripeIdempotencyError',
      message: "Keys for idempotent requests can only be used with the same parameters they were first used with. Try using a key other than 'same-key' if you meant to execute a different request.",
    });
  });

  it('refuses the same key on another endpoint', async () => {
    const stripe = sdkFor(await startFake());
    await createInvoiceSession(stripe, {}, { idempotencyKey: 'reused' });
    const error = await stripe.paymentIntents.create({ amount: 100, currency: 'usd' }, { idempotencyKey: 'reused' }).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(Stripe.errors.StripeIdempotencyError);
    expect((error as Error).message).toContain('can only be used for the same endpoint');
  });

  it('saves nothing for a request that failed validation, so the corrected request may use the key', async () => {
    const stripe = sdkFor(await startFake());
    await expect(createInvoiceSession(stripe, { success_url: 'not a url' }, { idempotencyKey: 'fix-and-retry' })).rejects.toMatchObject({ statusCode: 400, code: 'url_invalid' });
    const session = await createInvoiceSession(stripe, {}, { idempotencyKey: 'fix-and-retry' });
    expect(session.lastResponse.headers['idempotent-replayed']).toBeUndefined();
    expect(session.status).toBe('open');
  });

  it('replays a decline without charging the card again', async () => {
    const fake = await startFake();
    const stripe = sdkFor(fake);
    const intent = await stripe.paymentIntents.create({ amount: 5000, currency: 'usd' });
    const confirm = () => stripe.paymentIntents.confirm(intent.id, { payment_method: 'pm_card_chargeDeclined' }, { idempotencyKey: 'confirm-once' });

    const first = (await confirm().catch((e: unknown) => e)) as Stripe.errors.StripeCardError;
    const replay = (await confirm().catch((e: unknown) => e)) as Stripe.errors.StripeCardError;
    expect(first).toBeInstanceOf(Stripe.errors.StripeCardError);
    expect(replay).toBeInstanceOf(Stripe.errors.StripeCardError);
    expect(replay.charge).toBe(first.charge);
    expect(replay.headers?.['idempotent-replayed']).toBe('true');
    const events = (await (await fetch(`${fake.url}/_fake/events?type=payment_intent.payment_failed`)).json()) as { data: unknown[] };
    expect(events.data).toHaveLength(1);
  });

  it('keeps keys apart per API key, as Stripe keeps them per account', async () => {
    const fake = await startFake();
    const a = await createInvoiceSession(sdkFor(fake, 'sk_test_account_a'), {}, { idempotencyKey: 'shared' });
    const b = await createInvoiceSession(sdkFor(fake, 'sk_test_account_b'), {}, { idempotencyKey: 'shared' });
    expect(b.id).not.toBe(a.id);
  });

  it('refuses with 409 a second request while the first with the same key is still arriving', async () => {
    const fake = await startFake();
    const stripe = sdkFor(fake);
    const body = 'amount=2500&currency=usd&metadata[invoiceId]=inv_20';
    const slow = request(`${fake.url}/v1/payment_intents`, {
      method: 'POST',
      headers: {
        authorization: `Bearer ${TEST_KEY}`,
        'content-type': 'application/x-www-form-urlencoded',
        'content-length': Buffer.byteLength(body),
        'idempotency-key': 'double-click',
      },
    });
    const answer = new Promise<{ status: number; json: { id: string } }>((resolve, reject) => {
      slow.on('response', (res) => {
        let text = '';
        res.on('data', (c: Buffer) => (text += c.toString()));
        res.on('end', () => resolve({ status: res.statusCode!, json: JSON.parse(text) }));
      });
      slow.on('error', reject);
    });
    slow.write(body.slice(0, 10));
    await new Promise((resolve) => setTimeout(resolve, 100));

    const concurrent = await stripe.paymentIntents
      .create({ amount: 2500, currency: 'usd', metadata: { invoiceId: 'inv_20' } }, { idempotencyKey: 'double-click' })
      .catch((e: unknown) => e);
    expect(concurrent).toMatchObject({ statusCode: 409, rawType: 'idempotency_error', code: 'idempotency_key_in_use' });

    slow.end(body.slice(10));
    const first = await answer;
    expect(first.status).toBe(200);
    const retried = await stripe.paymentIntents.create({ amount: 2500, currency: 'usd', metadata: { invoiceId: 'inv_20' } }, { idempotencyKey: 'double-click' });
    expect(retried.id).toBe(first.json.id);
  });
});
