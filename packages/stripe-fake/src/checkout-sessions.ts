import { invalidRequest, resourceMissing, type StripeErrorBody } from './api-error.js';
import { route } from './api-route.js';
import { readExpand } from './expand.js';
import type { Fake } from './fake.js';
import { newId, unixNow } from './ids.js';
import { formatAmount, MAX_AMOUNT } from './money.js';
import type { Metadata, Params } from './params.js';
import { addPaymentMethod, chargeIntent, createPaymentIntent } from './payments.js';
import type { CheckoutSessionRecord, EventRequest, LineItemRecord } from './state.js';
import { renderCheckoutSession, renderPaymentIntent } from './stripe-objects.js';
import type { TestCard } from './test-cards.js';
import { readCurrency, readEmail, readUrl, requiredCurrency } from './validation.js';

const MIN_LIFETIME_S = 30 * 60;
const MAX_LIFETIME_S = 24 * 60 * 60;
/** Stripe's limit on line items in one payment-mode session. */
const MAX_LINE_ITEMS = 100;

type NewLineItem = Omit<LineItemRecord, 'id' | 'priceId' | 'productId'>;

interface NewCheckoutSession {
  lineItems: NewLineItem[];
  currency: string;
  amountTotal: number;
  successUrl: string;
  cancelUrl: string | null;
  metadata: Metadata;
  clientReferenceId: string | null;
  customerEmail: string | null;
  paymentIntentData: { metadata: Metadata; description: string | null };
  expiresAt: number | null;
  expand: string[];
}

function parseCreate(p: Params): NewCheckoutSession {
  const mode = p.oneOf('mode', ['payment', 'setup', 'subscription']);
  if (mode === undefined) throw p.missingError('mode');
  if (mode !== 'payment') throw invalidRequest(`Only mode=payment is supported here: Hitchbook takes one-off card payments, not mode=${mode}.`, { param: 'mode' });

  const items = p.hashList('line_items');
  if (!items || items.length === 0) throw invalidRequest('`line_items` is required in `payment` mode.', { param: 'line_items', code: 'parameter_missing' });
  if (items.length > MAX_LINE_ITEMS) throw invalidRequest(`A Checkout Session can have at most ${MAX_LINE_ITEMS} line items; ${items.length} were given.`, { param: 'line_items' });
  const lineItems = items.map(parseLineItem);
  const currency = readCurrency(p, 'currency') ?? lineItems[0]!.currency;
  lineItems.forEach((item, i) => {
    if (item.currency !== currency) {
      throw invalidRequest(`All line items must be in the session's currency (${currency}); line_items[${i}] is in ${item.currency}.`, {
        param: `line_items[${i}][price_data][currency]`,
      });
    }
  });
  const amountTotal = lineItems.reduce((sum, item) => sum + item.unitAmount * item.quantity, 0);
  if (amountTotal < 1) throw invalidRequest("The Checkout Session's total amount due must be greater than zero.", { param: 'line_items', code: 'amount_too_small' });
  if (amountTotal > MAX_AMOUNT) {
    throw invalidRequest(`The Checkout Session's total amount due (${formatAmount(amountTotal, currency)}) must be at most ${formatAmount(MAX_AMOUNT, currency)}.`, {
      param: 'line_items',
      code: 'amount_too_large',
    });
  }

  const successUrl = readUrl(p, 'success_url');
  if (successUrl === undefined) throw p.missingError('success_url');
  const methods = p.stringList('payment_method_types');
  methods?.forEach((type, i) => {
    if (type !== 'card') throw invalidRequest(`Invalid payment_method_types[${i}]: only card payments are available here, not ${type}.`, { param: `payment_method_types[${i}]` });
  });
  const intentData = p.hash('payment_intent_data');
  const expand = readExpand(p, 'checkout.session');
  return {
    lineItems,
    currency,
    amountTotal,
    successUrl,
    cancelUrl: readUrl(p, 'cancel_url') ?? null,
    metadata: p.metadata(),
    clientReferenceId: p.string('client_reference_id', { maxLength: 200 }) ?? null,
    customerEmail: readEmail(p, 'customer_email') ?? null,
    paymentIntentData: { metadata: intentData?.metadata() ?? {}, description: intentData?.string('description', { maxLength: 1000 }) ?? null },
    expiresAt: parseExpiresAt(p),
    expand,
  };
}

function parseLineItem(item: Params, i: number): NewLineItem {
  if (item.has('amount') || item.has('name')) {
    throw invalidRequest(
      `line_items[${i}] uses amount/name, which Stripe's current API no longer accepts; give line_items[${i}][price_data][unit_amount], [currency] and [product_data][name] instead.`,
      { param: `line_items[${i}][${item.has('amount') ? 'amount' : 'name'}]`, code: 'parameter_unknown' },
    );
  }
  const priceId = item.string('price');
  if (priceId !== undefined) throw resourceMissing('price', priceId, `line_items[${i}][price]`);
  const price = item.hash('price_data');
  if (!price) throw invalidRequest(`You must specify either \`price\` or \`price_data\` in each line item; line_items[${i}] has neither.`, { param: `line_items[${i}]` });
  const productId = price.string('product');
  if (productId !== undefined) throw resourceMissing('product', productId, price.nameOf('product'));
  const product = price.hash('product_data');
  if (!product) throw price.missingError('product_data');
  const line = {
    name: product.requiredString('name', { maxLength: 250 }),
    description: product.string('description', { maxLength: 1000 }) ?? null,
    currency: requiredCurrency(price, 'currency'),
    unitAmount: price.requiredInteger('unit_amount', { min: 0, max: MAX_AMOUNT }),
    quantity: item.requiredInteger('quantity', { min: 1, max: 999_999 }),
  };
  // Checked per line so the session total stays far inside exact integer range.
  if (line.unitAmount * line.quantity > MAX_AMOUNT) {
    throw invalidRequest(`line_items[${i}] comes to more than ${formatAmount(MAX_AMOUNT, line.currency)}, the most one payment can be.`, {
      param: `line_items[${i}][quantity]`,
      code: 'amount_too_large',
    });
  }
  return line;
}

function parseExpiresAt(p: Params): number | null {
  const expiresAt = p.integer('expires_at', { min: 0, max: Number.MAX_SAFE_INTEGER });
  if (expiresAt === undefined) return null;
  const now = unixNow();
  if (expiresAt < now + MIN_LIFETIME_S) throw invalidRequest('The `expires_at` timestamp must be at least 30 minutes from Checkout Session creation.', { param: 'expires_at' });
  if (expiresAt > now + MAX_LIFETIME_S) throw invalidRequest('The `expires_at` timestamp must be less than 24 hours from Checkout Session creation.', { param: 'expires_at' });
  return expiresAt;
}

export function findSession(fake: Fake, id: string): CheckoutSessionRecord {
  const session = fake.state.sessions.get(id);
  if (!session) throw resourceMissing('checkout.session', id, 'session');
  return session;
}

export function renderSession(fake: Fake, s: CheckoutSessionRecord, expand: string[] = []) {
  return renderCheckoutSession(fake.state, s, fake.checkoutUrl(s.id), expand);
}

/** Where the browser goes after paying: success_url with Stripe's `{CHECKOUT_SESSION_ID}` placeholder filled in. */
export function successRedirect(s: CheckoutSessionRecord): string {
  return s.successUrl.replaceAll('{CHECKOUT_SESSION_ID}', s.id);
}

export interface CardPayment {
  card: TestCard;
  expiry: { month: number; year: number };
  email: string | null;
}

/**
 * A payer paying an open session: the first attempt creates the session's PaymentIntent, a decline
 * leaves the session open for another card, and success completes it. Returns the card_error of a decline.
 */
export function payCheckoutSession(fake: Fake, s: CheckoutSessionRecord, payment: CardPayment, request: EventRequest): StripeErrorBody | null {
  if (s.status !== 'open') throw invalidRequest(`This Checkout Session is ${s.status === 'complete' ? 'already paid' : 'expired'} and can no longer be paid.`);
  const email = s.customerEmail ?? payment.email;
  const intent =
    (s.paymentIntentId && fake.state.paymentIntents.get(s.paymentIntentId)) ||
    createPaymentIntent(fake, {
      amount: s.amountTotal,
      currency: s.currency,
      metadata: { ...s.paymentIntentData.metadata },
      description: s.paymentIntentData.description,
      receiptEmail: null,
      checkoutSessionId: s.id,
    });
  s.paymentIntentId = intent.id;
  const declined = chargeIntent(fake, intent, addPaymentMethod(fake, payment.card, payment.expiry, email), request);
  if (declined) return declined;
  s.status = 'complete';
  s.paymentStatus = 'paid';
  s.paidByEmail = email;
  fake.publish('checkout.session.completed', renderSession(fake, s), request);
  return null;
}

export const checkoutSessionRoutes = [
  route({
    method: 'POST',
    path: /^\/v1\/checkout\/sessions$/,
    parse: parseCreate,
    run(fake, input) {
      const created = unixNow();
      const session: CheckoutSessionRecord = {
        id: newId('cs_test'),
        created,
        expiresAt: input.expiresAt ?? created + MAX_LIFETIME_S,
        status: 'open',
        paymentStatus: 'unpaid',
        currency: input.currency,
        amountSubtotal: input.amountTotal,
        amountTotal: input.amountTotal,
        lineItems: input.lineItems.map((item) => ({ ...item, id: newId('li'), priceId: newId('price'), productId: newId('prod') })),
        successUrl: input.successUrl,
        cancelUrl: input.cancelUrl,
        metadata: input.metadata,
        clientReferenceId: input.clientReferenceId,
        customerEmail: input.customerEmail,
        paidByEmail: null,
        paymentIntentData: input.paymentIntentData,
        paymentIntentId: null,
      };
      fake.state.sessions.set(session.id, session);
      return renderSession(fake, session, input.expand);
    },
  }),
  route({
    method: 'GET',
    path: /^\/v1\/checkout\/sessions\/([^/]+)$/,
    parse: (p) => readExpand(p, 'checkout.session'),
    run: (fake, expand, { ids }) => renderSession(fake, findSession(fake, ids[0]!), expand),
  }),
  route({
    method: 'POST',
    path: /^\/v1\/checkout\/sessions\/([^/]+)\/expire$/,
    parse: (p) => readExpand(p, 'checkout.session'),
    run(fake, expand, { ids, request }) {
      const session = findSession(fake, ids[0]!);
      if (session.status !== 'open') throw invalidRequest('Only Checkout Sessions with a status in ["open"] can be expired.', { param: 'session' });
      session.status = 'expired';
      const intent = session.paymentIntentId ? fake.state.paymentIntents.get(session.paymentIntentId) : undefined;
      if (intent) {
        // A session that expires after a declined attempt takes its PaymentIntent with it, as on Stripe.
        intent.status = 'canceled';
        intent.canceledAt = unixNow();
        intent.cancellationReason = 'abandoned';
        fake.publish('payment_intent.canceled', renderPaymentIntent(fake.state, intent), request);
      }
      fake.publish('checkout.session.expired', renderSession(fake, session), request);
      return renderSession(fake, session, expand);
    },
  }),
];
