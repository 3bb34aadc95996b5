import { Inject, Injectable, Logger } from '@nestjs/common';
import { and, eq } from 'drizzle-orm';
import Stripe from 'stripe';
import { checkoutSessions, payments, stripeEvents, type Executor } from '@hitchbook/db';
import { fromCents } from '@hitchbook/shared/money';
import { AppError } from '../../common/errors/app-error.js';
import { AuditService } from '../../core/audit.service.js';
import { APP_CONFIG, type AppConfig } from '../../core/config.js';
import { DB, type DbHandle } from '../../core/database.js';
import { InvoicePaymentsService } from '../invoices/invoice-payments.service.js';
import { cardsNotConfigured } from './checkout.service.js';
import { STRIPE } from './stripe-client.js';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const paymentNotBookedYet = () => new AppError('unavailable', 'The payment this refund belongs to is not booked yet; deliver the event again later.');
const badSignature = () => new AppError('validation', 'The webhook signature does not verify.', [{ path: 'Stripe-Signature', message: 'Missing, stale or not made with this endpoint’s secret.' }]);

/**
 * Stripe's events about the checkouts this server opened. Every event is verified over the exact bytes
 * received, recorded once by its id in the same transaction as its effect (a replay finds the id and
 * changes nothing), and checked against the session stored when checkout was opened before any money
 * is booked. Events can arrive in any order: a paid session stays paid whatever comes after it.
 */
@Injectable()
export class StripeWebhookService {
  private readonly logger = new Logger('StripeWebhook');

  constructor(
    @Inject(DB) private readonly dbh: DbHandle,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    @Inject(STRIPE) private readonly stripe: Stripe | null,
    @Inject(InvoicePaymentsService) private readonly payments: InvoicePaymentsService,
    @Inject(AuditService) private readonly audit: AuditService,
  ) {}

  async receive(rawBody: Buffer | undefined, signature: string | undefined): Promise<{ received: true }> {
    if (!this.stripe || !this.config.stripe) throw cardsNotConfigured();
    if (!rawBody || !signature) throw badSignature();
    let event: Stripe.Event;
    try {
      // The SDK's default tolerance refuses a signature older than five minutes.
      event = this.stripe.webhooks.constructEvent(rawBody, signature, this.config.stripe.webhookSecret);
    } catch {
      throw badSignature();
    }
    await this.dbh.db.transaction(async (tx) => {
      const [fresh] = await tx
        .insert(stripeEvents)
        .values({ id: event.id, type: event.type, stripeCreatedAt: new Date(event.created * 1000) })
        .onConflictDoNothing()
        .returning({ id: stripeEvents.id });
      if (!fresh) return;
      const outcome = await this.apply(event, tx);
      await tx.update(stripeEvents).set({ outcome }).where(eq(stripeEvents.id, event.id));
    });
    return { received: true };
  }

  private async apply(event: Stripe.Event, tx: Executor): Promise<string> {
    switch (event.type) {
      case 'checkout.session.completed':
      case 'checkout.session.async_payment_succeeded':
        return this.sessionPaid(event.data.object, event.created, tx);
      case 'checkout.session.expired': {
        // Only an open session lapses; a completed one stays completed whenever this arrives.
        await tx
          .update(checkoutSessions)
          .set({ status: 'expired' })
          .where(and(eq(checkoutSessions.stripeSessionId, event.data.object.id), eq(checkoutSessions.status, 'open')));
        return 'session expired';
      }
      case 'refund.created':
      case 'refund.updated':
        return this.refunded(event.data.object, tx);
      case 'charge.refunded':
        return this.chargeRefunded(event.data.object, tx);
      case 'payment_intent.payment_failed':
        // The payer saw the decline on the checkout page; the invoice stays open as it was.
        return `card declined: ${event.data.object.last_payment_error?.message ?? 'no reason given'}`;
      default:
        return 'ignored';
    }
  }

  private async sessionPaid(session: Stripe.Checkout.Session, created: number, tx: Executor): Promise<string> {
    if (session.payment_status !== 'paid') return `not paid yet (${session.payment_status})`;
    // Found by Stripe's session id across operations: the event names no operation we could trust
    // before the stored session confirms it.
    const [stored] = await tx.select().from(checkoutSessions).where(eq(checkoutSessions.stripeSessionId, session.id));
    if (!stored) return this.mismatch(null, 'unknown checkout session', session);
    const problems = [
      session.metadata?.operationId !== stored.operationId ? 'operation' : null,
      session.metadata?.invoiceId !== stored.invoiceId ? 'invoice' : null,
      session.amount_total !== stored.amountCents ? `amount ${session.amount_total} ≠ ${stored.amountCents}` : null,
      session.currency !== stored.currency ? `currency ${session.currency} ≠ ${stored.currency}` : null,
    ].filter((p): p is string => p !== null);
    if (problems.length > 0) return this.mismatch(stored, `mismatch: ${problems.join(', ')}`, session, tx);
    const paymentIntentId = typeof session.payment_intent === 'string' ? session.payment_intent : session.payment_intent?.id;
    if (!paymentIntentId) return this.mismatch(stored, 'no payment intent', session, tx);

    await tx.update(checkoutSessions).set({ status: 'complete' }).where(eq(checkoutSessions.id, stored.id));
    const recorded = await this.payments.recordCard(
      {
        operationId: stored.operationId,
        invoiceId: stored.invoiceId,
        amount: fromCents(stored.amountCents).toFixed(2),
        receivedOn: new Date(created * 1000).toISOString().slice(0, 10),
        paymentIntentId,
        checkoutSessionId: session.id,
      },
      tx,
    );
    if (!recorded.recorded) return 'payment already recorded';
    return recorded.overpaid ? 'payment recorded: refund due to the payer' : 'payment recorded';
  }

  /** A refund made here or on Stripe's dashboard; one that did not go through books nothing. */
  private async refunded(refund: Stripe.Refund, tx: Executor): Promise<string> {
    if (refund.status !== 'succeeded' && refund.status !== 'pending') return `refund ${refund.status ?? 'without a status'}: nothing booked`;
    const paymentIntentId = typeof refund.payment_intent === 'string' ? refund.payment_intent : refund.payment_intent?.id;
    if (!paymentIntentId) return 'refund without a payment intent: nothing booked';
    const outcome = await this.payments.recordRefund(
      { stripeRefundId: refund.id, paymentIntentId, amountCents: refund.amount, reason: refund.reason ?? null, createdBy: null },
      tx,
    );
    if (!outcome.recorded && outcome.outcome === 'refund of a payment not recorded here' && (await this.isOurPendingPayment(paymentIntentId, tx))) {
      // The refund overtook the event that books its payment. Recording it now would lose it for good,
      // since a replay of a recorded event changes nothing; refusing makes Stripe deliver it again.
      throw paymentNotBookedYet();
    }
    if (outcome.recorded) return 'refund recorded';
    if (outcome.outcome.startsWith('mismatch')) this.logger.warn(`Refund ${refund.id}: ${outcome.outcome}; nothing booked.`);
    return outcome.outcome;
  }

  /** Whether Stripe says this payment intent was made by one of our checkouts, whose payment is simply not booked yet. */
  private async isOurPendingPayment(paymentIntentId: string, tx: Executor): Promise<boolean> {
    let intent: Stripe.PaymentIntent;
    try {
      intent = await this.stripe!.paymentIntents.retrieve(paymentIntentId);
    } catch (err) {
      if (err instanceof Stripe.errors.StripeInvalidRequestError) return false;
      throw paymentNotBookedYet();
    }
    const invoiceId = intent.metadata?.invoiceId;
    const operationId = intent.metadata?.operationId;
    if (!invoiceId || !operationId || !UUID.test(invoiceId) || !UUID.test(operationId)) return false;
    const [session] = await tx
      .select({ id: checkoutSessions.id })
      .from(checkoutSessions)
      .where(and(eq(checkoutSessions.operationId, operationId), eq(checkoutSessions.invoiceId, invoiceId)))
      .limit(1);
    return session !== undefined;
  }

  /**
   * Stripe sends this beside refund.created; the charge names only the total refunded, not which
   * refunds, so it books nothing and only says whether the refund events have all been booked.
   */
  private async chargeRefunded(charge: Stripe.Charge, tx: Executor): Promise<string> {
    const paymentIntentId = typeof charge.payment_intent === 'string' ? charge.payment_intent : charge.payment_intent?.id;
    if (!paymentIntentId) return 'charge without a payment intent: ignored';
    const [payment] = await tx.select({ amountRefunded: payments.amountRefunded }).from(payments).where(eq(payments.stripePaymentIntentId, paymentIntentId));
    if (!payment) return 'refund of a payment not recorded here';
    const charged = fromCents(charge.amount_refunded);
    return charged.eq(payment.amountRefunded) ? 'refunds all recorded' : `charge shows ${charged.toFixed(2)} refunded, ${payment.amountRefunded} recorded: waiting for its refund events`;
  }

  /** A signed event that does not match what this server opened books nothing, and is kept for the owner to see. */
  private async mismatch(stored: { operationId: string; invoiceId: string } | null, outcome: string, session: Stripe.Checkout.Session, tx?: Executor): Promise<string> {
    this.logger.warn(`Checkout session ${session.id}: ${outcome}; nothing booked.`);
    if (stored && tx) {
      await this.audit.record(
        { operationId: stored.operationId, actorUserId: null, action: 'payment.mismatch', entityType: 'invoice', entityId: stored.invoiceId, after: { session: session.id, outcome, amountTotal: session.amount_total, currency: session.currency } },
        tx,
      );
    }
    return outcome;
  }
}
