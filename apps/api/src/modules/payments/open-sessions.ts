import { and, eq } from 'drizzle-orm';
import Stripe from 'stripe';
import { checkoutSessions, type Executor } from '@hitchbook/db';
import { AppError, conflict } from '../../common/errors/app-error.js';

const linkNotCancelled = () => new AppError('unavailable', 'The invoice’s card pay link could not be cancelled just now, so it was not voided; try again shortly.');

/**
 * Expires every pay link still open for an invoice, so nobody can pay a document that no longer
 * stands or a balance that has changed. Runs inside the caller's transaction with the invoice locked: a checkout cannot be opened
 * meanwhile. A session the payer completed a moment ago cannot be expired; the caller is refused, as
 * the money is on its way and the webhook will record it.
 */
export async function expireOpenSessions(stripe: Stripe | null, tx: Executor, operationId: string, invoiceId: string, options: { bestEffort?: boolean } = {}): Promise<string[]> {
  if (options.bestEffort) {
    try {
      return await expireOpenSessions(stripe, tx, operationId, invoiceId);
    } catch (err) {
      // A change of balance (a cheque, a credit note) goes through when Stripe cannot be reached: a payment
      // through the old link is then booked with the refund due flagged, not lost.
      if (err instanceof AppError && err.code === 'unavailable') return [];
      throw err;
    }
  }
  const open = await tx
    .select({ id: checkoutSessions.id, stripeSessionId: checkoutSessions.stripeSessionId })
    .from(checkoutSessions)
    .where(and(eq(checkoutSessions.operationId, operationId), eq(checkoutSessions.invoiceId, invoiceId), eq(checkoutSessions.status, 'open')));
  if (open.length === 0) return [];
  if (!stripe) throw new AppError('unavailable', 'Card payments are not configured, so the invoice’s open pay link cannot be cancelled; it was not voided.');
  const expired: string[] = [];
  for (const session of open) {
    const status = await expireOne(stripe, session.stripeSessionId);
    if (status === 'complete') throw conflict('A card payment for this invoice has just been made, so it was not voided. Reload to see the payment, then correct the invoice with a credit note.');
    await tx.update(checkoutSessions).set({ status: 'expired' }).where(eq(checkoutSessions.id, session.id));
    expired.push(session.stripeSessionId);
  }
  return expired;
}

async function expireOne(stripe: Stripe, sessionId: string): Promise<'expired' | 'complete'> {
  try {
    await stripe.checkout.sessions.expire(sessionId, {}, { idempotencyKey: `expire:${sessionId}` });
    return 'expired';
  } catch (err) {
    if (!(err instanceof Stripe.errors.StripeInvalidRequestError)) {
      if (err instanceof Stripe.errors.StripeError) throw linkNotCancelled();
      throw err;
    }
  }
  // Stripe refuses to expire a session that is no longer open; ask it which way it went.
  try {
    const session = await stripe.checkout.sessions.retrieve(sessionId);
    return session.status === 'complete' ? 'complete' : 'expired';
  } catch (err) {
    if (err instanceof Stripe.errors.StripeError) throw linkNotCancelled();
    throw err;
  }
}
