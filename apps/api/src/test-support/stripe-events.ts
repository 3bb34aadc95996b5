import { randomUUID } from 'node:crypto';

export interface StoredSessionRef {
  stripeSessionId: string;
  amountCents: number;
  operationId: string;
  invoiceId: string;
}

/** A Stripe-shaped object id with the given prefix (evt, pi, re …), unique per call. */
export function testStripeId(prefix: string): string {
  return `${prefix}_test_${randomUUID().replace(/-/g, '')}`;
}

/** A completed-session event as Stripe would send it for a stored session, with any field of the session changed. */
export function completedSessionEvent(session: StoredSessionRef, change: Record<string, unknown> = {}) {
  return {
    id: testStripeId('evt'),
    object: 'event',
    type: 'checkout.session.completed',
    created: Math.floor(Date.now() / 1000),
    livemode: false,
    data: {
      object: {
        id: session.stripeSessionId,
        object: 'checkout.session',
        amount_total: session.amountCents,
        currency: 'usd',
        payment_status: 'paid',
        status: 'complete',
        payment_intent: testStripeId('pi'),
        metadata: { operationId: session.operationId, invoiceId: session.invoiceId },
        ...change,
      },
    },
  };
}
