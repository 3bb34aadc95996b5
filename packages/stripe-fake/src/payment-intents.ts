import { invalidRequest, resourceMissing } from './api-error.js';
import { route } from './api-route.js';
import { readExpand } from './expand.js';
import type { Fake } from './fake.js';
import { unixNow } from './ids.js';
import { MAX_AMOUNT } from './money.js';
import type { Params } from './params.js';
import { cardDeclined, chargeIntent, createPaymentIntent, paymentMethodFromId } from './payments.js';
import type { EventRequest, PaymentIntentRecord, PaymentIntentStatus } from './state.js';
import { renderPaymentIntent } from './stripe-objects.js';
import { readEmail, requiredCurrency } from './validation.js';

/** The statuses this fake's intents can be in when each action is allowed; Stripe's messages list its full sets. */
const ALLOWED_FROM: Record<'confirm' | 'cancel', { here: PaymentIntentStatus[]; stripe: string }> = {
  confirm: { here: ['requires_payment_method', 'requires_confirmation'], stripe: 'requires_confirmation, requires_payment_method, requires_action' },
  cancel: {
    here: ['requires_payment_method', 'requires_confirmation'],
    stripe: 'requires_payment_method, requires_capture, requires_confirmation, requires_action, processing',
  },
};
const CANCELLATION_REASONS = ['duplicate', 'fraudulent', 'requested_by_customer', 'abandoned'] as const;

function findIntent(fake: Fake, id: string): PaymentIntentRecord {
  const intent = fake.state.paymentIntents.get(id);
  if (!intent) throw resourceMissing('payment_intent', id, 'intent');
  return intent;
}

const expandIntent = (p: Params) => readExpand(p, 'payment_intent');

function cardOnly(p: Params): void {
  p.stringList('payment_method_types')?.forEach((type, i) => {
    if (type !== 'card') throw invalidRequest(`Invalid payment_method_types[${i}]: only card payments are available here, not ${type}.`, { param: `payment_method_types[${i}]` });
  });
}

/** Checkout owns the intents it creates: they are paid on the session's page and end with the session. */
function refuseIfCheckout(intent: PaymentIntentRecord, action: 'confirm' | 'cancel'): void {
  if (!intent.checkoutSessionId) return;
  throw invalidRequest(
    action === 'confirm'
      ? `You cannot confirm this PaymentIntent because it belongs to Checkout Session ${intent.checkoutSessionId}; it is paid on that session's page.`
      : `You cannot cancel this PaymentIntent because it was created by Checkout. Expire Checkout Session ${intent.checkoutSessionId} instead.`,
    { code: 'payment_intent_unexpected_state' },
  );
}

function requireStatusFor(intent: PaymentIntentRecord, action: 'confirm' | 'cancel'): void {
  const allowed = ALLOWED_FROM[action];
  if (allowed.here.includes(intent.status)) return;
  throw invalidRequest(
    `You cannot ${action} this PaymentIntent because it has a status of ${intent.status}. Only a PaymentIntent with one of the following statuses may be ${action === 'confirm' ? 'confirmed' : 'canceled'}: ${allowed.stripe}.`,
    { code: 'payment_intent_unexpected_state' },
  );
}

/** Charges the intent and answers as Stripe's confirm does: the intent, or a 402 card_error carrying it. */
function confirm(fake: Fake, intent: PaymentIntentRecord, paymentMethod: string | undefined, request: EventRequest, expand: string[]) {
  // After a decline the failed card is no longer the intent's to use, so only a not-yet-tried one is taken.
  const attached = intent.status === 'requires_confirmation' && intent.paymentMethodId ? fake.state.paymentMethods.get(intent.paymentMethodId) : undefined;
  const pm = paymentMethod !== undefined ? paymentMethodFromId(fake, paymentMethod) : attached;
  if (!pm) {
    throw invalidRequest(
      "You cannot confirm this PaymentIntent because it's missing a payment method. You can either update the PaymentIntent with a payment method and then confirm it again, or confirm it again directly with a payment method.",
      { code: 'payment_intent_unexpected_state' },
    );
  }
  const declined = chargeIntent(fake, intent, pm, request);
  if (declined) throw cardDeclined(declined);
  return renderPaymentIntent(fake.state, intent, expand);
}

export const paymentIntentRoutes = [
  route({
    method: 'POST',
    path: /^\/v1\/payment_intents$/,
    parse(p) {
      cardOnly(p);
      return {
        amount: p.requiredInteger('amount', { min: 1, max: MAX_AMOUNT }),
        currency: requiredCurrency(p, 'currency'),
        metadata: p.metadata(),
        description: p.string('description', { maxLength: 1000 }) ?? null,
        receiptEmail: readEmail(p, 'receipt_email') ?? null,
        paymentMethod: p.string('payment_method'),
        confirm: p.boolean('confirm') ?? false,
        expand: expandIntent(p),
      };
    },
    run(fake, input, { request }) {
      const intent = createPaymentIntent(fake, { ...input, checkoutSessionId: null });
      if (input.confirm) return confirm(fake, intent, input.paymentMethod, request, input.expand);
      if (input.paymentMethod !== undefined) {
        intent.paymentMethodId = paymentMethodFromId(fake, input.paymentMethod).id;
        intent.status = 'requires_confirmation';
      }
      return renderPaymentIntent(fake.state, intent, input.expand);
    },
  }),
  route({
    method: 'GET',
    path: /^\/v1\/payment_intents\/([^/]+)$/,
    parse: expandIntent,
    run: (fake, expand, { ids }) => renderPaymentIntent(fake.state, findIntent(fake, ids[0]!), expand),
  }),
  route({
    method: 'POST',
    path: /^\/v1\/payment_intents\/([^/]+)\/confirm$/,
    parse: (p) => ({ paymentMethod: p.string('payment_method'), receiptEmail: readEmail(p, 'receipt_email'), expand: expandIntent(p) }),
    run(fake, input, { ids, request }) {
      const intent = findIntent(fake, ids[0]!);
      refuseIfCheckout(intent, 'confirm');
      requireStatusFor(intent, 'confirm');
      if (input.receiptEmail !== undefined) intent.receiptEmail = input.receiptEmail;
      return confirm(fake, intent, input.paymentMethod, request, input.expand);
    },
  }),
  route({
    method: 'POST',
    path: /^\/v1\/payment_intents\/([^/]+)\/cancel$/,
    parse: (p) => ({ reason: p.oneOf('cancellation_reason', CANCELLATION_REASONS) ?? null, expand: expandIntent(p) }),
    run(fake, input, { ids, request }) {
      const intent = findIntent(fake, ids[0]!);
      refuseIfCheckout(intent, 'cancel');
      requireStatusFor(intent, 'cancel');
      intent.status = 'canceled';
      intent.canceledAt = unixNow();
      intent.cancellationReason = input.reason;
      fake.publish('payment_intent.canceled', renderPaymentIntent(fake.state, intent), request);
      return renderPaymentIntent(fake.state, intent, input.expand);
    },
  }),
];
