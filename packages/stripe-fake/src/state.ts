import type { StripeErrorBody } from './api-error.js';
import type { Metadata } from './params.js';
import type { CardFailure, TestCard } from './test-cards.js';

export interface LineItemRecord {
  id: string;
  priceId: string;
  productId: string;
  name: string;
  description: string | null;
  currency: string;
  unitAmount: number;
  quantity: number;
}

export interface CheckoutSessionRecord {
  id: string;
  created: number;
  expiresAt: number;
  status: 'open' | 'complete' | 'expired';
  paymentStatus: 'unpaid' | 'paid';
  currency: string;
  amountSubtotal: number;
  amountTotal: number;
  lineItems: LineItemRecord[];
  /** As given, so `{CHECKOUT_SESSION_ID}` is still there to be replaced on redirect. */
  successUrl: string;
  cancelUrl: string | null;
  metadata: Metadata;
  clientReferenceId: string | null;
  customerEmail: string | null;
  /** The email the payer confirmed on the checkout page. */
  paidByEmail: string | null;
  paymentIntentData: { metadata: Metadata; description: string | null };
  paymentIntentId: string | null;
}

export type PaymentIntentStatus = 'requires_payment_method' | 'requires_confirmation' | 'succeeded' | 'canceled';

export interface PaymentIntentRecord {
  id: string;
  created: number;
  amount: number;
  currency: string;
  status: PaymentIntentStatus;
  amountReceived: number;
  metadata: Metadata;
  description: string | null;
  receiptEmail: string | null;
  clientSecret: string;
  paymentMethodId: string | null;
  latestChargeId: string | null;
  lastPaymentError: StripeErrorBody | null;
  canceledAt: number | null;
  cancellationReason: string | null;
  /** Set when Checkout created this PaymentIntent; such intents are driven through their session. */
  checkoutSessionId: string | null;
}

/** A card as a PaymentMethod, made from a test token such as pm_card_visa or from numbers typed on the checkout page. */
export interface PaymentMethodRecord {
  id: string;
  created: number;
  card: TestCard;
  expMonth: number;
  expYear: number;
  email: string | null;
}

export interface ChargeRecord {
  id: string;
  created: number;
  amount: number;
  currency: string;
  status: 'succeeded' | 'failed';
  failure: CardFailure | null;
  amountRefunded: number;
  paymentIntentId: string;
  paymentMethodId: string;
  description: string | null;
  metadata: Metadata;
  receiptEmail: string | null;
}

export interface RefundRecord {
  id: string;
  created: number;
  amount: number;
  currency: string;
  chargeId: string;
  paymentIntentId: string;
  reason: string | null;
  metadata: Metadata;
}

/** Where the request that caused an event came from; both null for a payer on the checkout page. */
export interface EventRequest {
  id: string | null;
  idempotency_key: string | null;
}

export interface EventRecord {
  id: string;
  type: string;
  created: number;
  apiVersion: string;
  /** The object as it was when the event happened, as Stripe keeps it. */
  object: Record<string, unknown>;
  request: EventRequest;
}

/** Everything the fake remembers; it lives in memory and `clear()` forgets it. */
export class FakeState {
  readonly sessions = new Map<string, CheckoutSessionRecord>();
  readonly paymentIntents = new Map<string, PaymentIntentRecord>();
  readonly paymentMethods = new Map<string, PaymentMethodRecord>();
  readonly charges = new Map<string, ChargeRecord>();
  readonly refunds = new Map<string, RefundRecord>();
  readonly events = new Map<string, EventRecord>();

  clear(): void {
    for (const map of [this.sessions, this.paymentIntents, this.paymentMethods, this.charges, this.refunds, this.events]) map.clear();
  }
}
