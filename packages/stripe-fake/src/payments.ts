import { ApiError, errorBody, resourceMissing, type StripeErrorBody } from './api-error.js';
import type { Fake } from './fake.js';
import { newId, randomToken, unixNow } from './ids.js';
import type { Metadata } from './params.js';
import type { EventRequest, PaymentIntentRecord, PaymentMethodRecord } from './state.js';
import { renderPaymentIntent } from './stripe-objects.js';
import { cardFromPaymentMethod, issuerResponse, type CardFailure, type TestCard } from './test-cards.js';

export interface NewPaymentIntent {
  amount: number;
  currency: string;
  metadata: Metadata;
  description: string | null;
  receiptEmail: string | null;
  checkoutSessionId: string | null;
}

export function createPaymentIntent(fake: Fake, input: NewPaymentIntent): PaymentIntentRecord {
  const id = newId('pi');
  const intent: PaymentIntentRecord = {
    id,
    created: unixNow(),
    amount: input.amount,
    currency: input.currency,
    status: 'requires_payment_method',
    amountReceived: 0,
    metadata: input.metadata,
    description: input.description,
    receiptEmail: input.receiptEmail,
    clientSecret: `${id}_secret_${randomToken(25)}`,
    paymentMethodId: null,
    latestChargeId: null,
    lastPaymentError: null,
    canceledAt: null,
    cancellationReason: null,
    checkoutSessionId: input.checkoutSessionId,
  };
  fake.state.paymentIntents.set(id, intent);
  return intent;
}

export function addPaymentMethod(fake: Fake, card: TestCard, expiry: { month: number; year: number }, email: string | null): PaymentMethodRecord {
  const pm: PaymentMethodRecord = { id: newId('pm'), created: unixNow(), card, expMonth: expiry.month, expYear: expiry.year, email };
  fake.state.paymentMethods.set(pm.id, pm);
  return pm;
}

/** A PaymentMethod from a test token (each use makes a new one, as on Stripe) or one made earlier. */
export function paymentMethodFromId(fake: Fake, id: string): PaymentMethodRecord {
  const existing = fake.state.paymentMethods.get(id);
  if (existing) return existing;
  const card = cardFromPaymentMethod(id);
  if (!card) throw resourceMissing('PaymentMethod', id, 'payment_method');
  return addPaymentMethod(fake, card, { month: 12, year: new Date().getUTCFullYear() + 3 }, null);
}

/**
 * Charges the intent's full amount to `pm` as the issuer of that test card answers, and records the
 * charge, the intent's new state and its event. Returns the card_error for a decline, null on success.
 */
export function chargeIntent(fake: Fake, intent: PaymentIntentRecord, pm: PaymentMethodRecord, request: EventRequest): StripeErrorBody | null {
  const failure = issuerResponse(pm.card);
  const chargeId = newId('ch');
  fake.state.charges.set(chargeId, {
    id: chargeId,
    created: unixNow(),
    amount: intent.amount,
    currency: intent.currency,
    status: failure ? 'failed' : 'succeeded',
    failure,
    amountRefunded: 0,
    paymentIntentId: intent.id,
    paymentMethodId: pm.id,
    description: intent.description,
    metadata: { ...intent.metadata },
    receiptEmail: intent.receiptEmail,
  });
  intent.paymentMethodId = pm.id;
  intent.latestChargeId = chargeId;
  if (failure) {
    intent.status = 'requires_payment_method';
    intent.lastPaymentError = cardError(failure, { charge: chargeId });
    fake.publish('payment_intent.payment_failed', renderPaymentIntent(fake.state, intent), request);
    return { ...intent.lastPaymentError, payment_intent: renderPaymentIntent(fake.state, intent) };
  }
  intent.status = 'succeeded';
  intent.amountReceived = intent.amount;
  intent.lastPaymentError = null;
  fake.publish('payment_intent.succeeded', renderPaymentIntent(fake.state, intent), request);
  return null;
}

export function cardError(failure: CardFailure, extra: { charge?: string } = {}): StripeErrorBody {
  return errorBody('card_error', failure.message, {
    code: failure.code,
    ...(failure.decline_code ? { decline_code: failure.decline_code } : {}),
    ...(failure.param ? { param: failure.param } : {}),
    ...extra,
  });
}

export function cardDeclined(body: StripeErrorBody): ApiError {
  return new ApiError(402, body);
}
