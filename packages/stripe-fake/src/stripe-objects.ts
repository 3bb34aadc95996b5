import { expansionOf } from './expand.js';
import type {
  ChargeRecord,
  CheckoutSessionRecord,
  EventRecord,
  FakeState,
  PaymentIntentRecord,
  PaymentMethodRecord,
  RefundRecord,
} from './state.js';

/**
 * The JSON Stripe returns for each object, built from the records in `FakeState`.
 * Fields the fake does not model carry the value Stripe gives them for a plain card payment, so the
 * SDK's types and any code written against real Stripe read the same shapes here.
 * `expand` holds `expand[]` paths already checked by `readExpand`.
 */
export type StripeJson = Record<string, unknown>;

export function renderCheckoutSession(state: FakeState, s: CheckoutSessionRecord, url: string, expand: string[] = []): StripeJson {
  const paymentIntentPaths = expansionOf(expand, 'payment_intent');
  const intent = s.paymentIntentId ? state.paymentIntents.get(s.paymentIntentId) : undefined;
  return {
    id: s.id,
    object: 'checkout.session',
    after_expiration: null,
    allow_promotion_codes: null,
    amount_subtotal: s.amountSubtotal,
    amount_total: s.amountTotal,
    automatic_tax: { enabled: false, liability: null, status: null },
    billing_address_collection: null,
    cancel_url: s.cancelUrl,
    client_reference_id: s.clientReferenceId,
    client_secret: null,
    consent: null,
    consent_collection: null,
    created: s.created,
    currency: s.currency,
    custom_fields: [],
    custom_text: { after_submit: null, shipping_address: null, submit: null, terms_of_service_acceptance: null },
    customer: null,
    customer_creation: 'if_required',
    customer_details:
      s.status === 'complete' ? { address: null, email: s.paidByEmail, name: null, phone: null, tax_exempt: 'none', tax_ids: [] } : null,
    customer_email: s.customerEmail,
    expires_at: s.expiresAt,
    invoice: null,
    invoice_creation: null,
    ...(expansionOf(expand, 'line_items') ? { line_items: renderLineItems(s) } : {}),
    livemode: false,
    locale: null,
    metadata: { ...s.metadata },
    mode: 'payment',
    payment_intent: intent && paymentIntentPaths ? renderPaymentIntent(state, intent, paymentIntentPaths) : s.paymentIntentId,
    payment_link: null,
    payment_method_collection: 'if_required',
    payment_method_options: {},
    payment_method_types: ['card'],
    payment_status: s.paymentStatus,
    phone_number_collection: { enabled: false },
    recovered_from: null,
    setup_intent: null,
    shipping_address_collection: null,
    shipping_cost: null,
    shipping_options: [],
    status: s.status,
    submit_type: null,
    subscription: null,
    success_url: s.successUrl,
    total_details: { amount_discount: 0, amount_shipping: 0, amount_tax: 0 },
    ui_mode: 'hosted',
    // Stripe clears the URL once the session can no longer be paid.
    url: s.status === 'open' ? url : null,
  };
}

function renderLineItems(s: CheckoutSessionRecord): StripeJson {
  return {
    object: 'list',
    data: s.lineItems.map((item) => ({
      id: item.id,
      object: 'item',
      amount_discount: 0,
      amount_subtotal: item.unitAmount * item.quantity,
      amount_tax: 0,
      amount_total: item.unitAmount * item.quantity,
      currency: item.currency,
      description: item.name,
      price: {
        id: item.priceId,
        object: 'price',
        active: false,
        billing_scheme: 'per_unit',
        created: s.created,
        currency: item.currency,
        livemode: false,
        lookup_key: null,
        metadata: {},
        nickname: null,
        product: item.productId,
        recurring: null,
        tax_behavior: 'unspecified',
        type: 'one_time',
        unit_amount: item.unitAmount,
        unit_amount_decimal: String(item.unitAmount),
      },
      quantity: item.quantity,
    })),
    has_more: false,
    url: `/v1/checkout/sessions/${s.id}/line_items`,
  };
}

export function renderPaymentIntent(state: FakeState, pi: PaymentIntentRecord, expand: string[] = []): StripeJson {
  const chargePaths = expansionOf(expand, 'latest_charge');
  const charge = pi.latestChargeId ? state.charges.get(pi.latestChargeId) : undefined;
  const lastError = pi.lastPaymentError;
  const failedMethod = lastError && pi.paymentMethodId ? state.paymentMethods.get(pi.paymentMethodId) : undefined;
  return {
    id: pi.id,
    object: 'payment_intent',
    amount: pi.amount,
    amount_capturable: 0,
    amount_received: pi.amountReceived,
    application: null,
    application_fee_amount: null,
    automatic_payment_methods: null,
    canceled_at: pi.canceledAt,
    cancellation_reason: pi.cancellationReason,
    capture_method: 'automatic',
    client_secret: pi.clientSecret,
    confirmation_method: 'automatic',
    created: pi.created,
    currency: pi.currency,
    customer: null,
    description: pi.description,
    last_payment_error: lastError ? { ...lastError, ...(failedMethod ? { payment_method: renderPaymentMethod(failedMethod) } : {}) } : null,
    latest_charge: charge && chargePaths ? renderCharge(state, charge, chargePaths) : pi.latestChargeId,
    livemode: false,
    metadata: { ...pi.metadata },
    next_action: null,
    on_behalf_of: null,
    payment_method: pi.paymentMethodId,
    payment_method_options: { card: { installments: null, mandate_options: null, network: null, request_three_d_secure: 'automatic' } },
    payment_method_types: ['card'],
    processing: null,
    receipt_email: pi.receiptEmail,
    review: null,
    setup_future_usage: null,
    shipping: null,
    source: null,
    statement_descriptor: null,
    statement_descriptor_suffix: null,
    status: pi.status,
    transfer_data: null,
    transfer_group: null,
  };
}

function renderPaymentMethod(pm: PaymentMethodRecord): StripeJson {
  return {
    id: pm.id,
    object: 'payment_method',
    billing_details: { address: null, email: pm.email, name: null, phone: null },
    card: renderCardDetails(pm),
    created: pm.created,
    customer: null,
    livemode: false,
    metadata: {},
    type: 'card',
  };
}

function renderCardDetails(pm: PaymentMethodRecord): StripeJson {
  return {
    brand: pm.card.brand,
    country: 'US',
    exp_month: pm.expMonth,
    exp_year: pm.expYear,
    funding: pm.card.funding,
    last4: pm.card.last4,
  };
}

export function renderCharge(state: FakeState, c: ChargeRecord, expand: string[] = []): StripeJson {
  const intentPaths = expansionOf(expand, 'payment_intent');
  const intent = state.paymentIntents.get(c.paymentIntentId);
  const pm = state.paymentMethods.get(c.paymentMethodId)!;
  const succeeded = c.status === 'succeeded';
  return {
    id: c.id,
    object: 'charge',
    amount: c.amount,
    amount_captured: succeeded ? c.amount : 0,
    amount_refunded: c.amountRefunded,
    application: null,
    application_fee: null,
    application_fee_amount: null,
    balance_transaction: null,
    billing_details: { address: null, email: pm.email, name: null, phone: null },
    calculated_statement_descriptor: null,
    captured: succeeded,
    created: c.created,
    currency: c.currency,
    customer: null,
    description: c.description,
    disputed: false,
    failure_balance_transaction: null,
    failure_code: c.failure?.code ?? null,
    failure_message: c.failure?.message ?? null,
    fraud_details: {},
    livemode: false,
    metadata: { ...c.metadata },
    on_behalf_of: null,
    outcome: succeeded
      ? { network_status: 'approved_by_network', reason: null, risk_level: 'normal', seller_message: 'Payment complete.', type: 'authorized' }
      : {
          network_status: 'declined_by_network',
          reason: c.failure?.decline_code ?? null,
          risk_level: 'normal',
          seller_message: 'The bank did not return any further details with this decline.',
          type: 'issuer_declined',
        },
    paid: succeeded,
    payment_intent: intent && intentPaths ? renderPaymentIntent(state, intent, intentPaths) : c.paymentIntentId,
    payment_method: c.paymentMethodId,
    payment_method_details: {
      card: {
        ...renderCardDetails(pm),
        checks: { address_line1_check: null, address_postal_code_check: null, cvc_check: c.failure?.code === 'incorrect_cvc' ? 'fail' : 'pass' },
        network: pm.card.brand,
      },
      type: 'card',
    },
    receipt_email: c.receiptEmail,
    receipt_number: null,
    receipt_url: null,
    refunded: succeeded && c.amountRefunded === c.amount,
    review: null,
    shipping: null,
    source: null,
    statement_descriptor: null,
    statement_descriptor_suffix: null,
    status: c.status,
    transfer_data: null,
    transfer_group: null,
  };
}

export function renderRefund(state: FakeState, r: RefundRecord, expand: string[] = []): StripeJson {
  const chargePaths = expansionOf(expand, 'charge');
  const intentPaths = expansionOf(expand, 'payment_intent');
  const charge = state.charges.get(r.chargeId)!;
  const intent = state.paymentIntents.get(r.paymentIntentId)!;
  return {
    id: r.id,
    object: 'refund',
    amount: r.amount,
    balance_transaction: null,
    charge: chargePaths ? renderCharge(state, charge, chargePaths) : r.chargeId,
    created: r.created,
    currency: r.currency,
    metadata: { ...r.metadata },
    payment_intent: intentPaths ? renderPaymentIntent(state, intent, intentPaths) : r.paymentIntentId,
    payment_method: charge.paymentMethodId,
    reason: r.reason,
    receipt_number: null,
    source_transfer_reversal: null,
    status: 'succeeded',
    transfer_reversal: null,
  };
}

/** `pendingWebhooks` is how many endpoints still have to acknowledge the event: 0 or 1 here. */
export function renderEvent(e: EventRecord, pendingWebhooks: number): StripeJson {
  return {
    id: e.id,
    object: 'event',
    api_version: e.apiVersion,
    created: e.created,
    data: { object: e.object },
    livemode: false,
    pending_webhooks: pendingWebhooks,
    request: { ...e.request },
    type: e.type,
  };
}
