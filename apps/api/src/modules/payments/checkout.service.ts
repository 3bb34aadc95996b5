import { Inject, Injectable } from '@nestjs/common';
import { and, count, desc, eq, gt, sql } from 'drizzle-orm';
import Stripe from 'stripe';
import { checkoutSessions } from '@hitchbook/db';
import { Dec } from '@hitchbook/shared/decimal';
import { toMoneyString, toStripeCentsOrThrow } from '@hitchbook/shared/money';
import type { CheckoutDto } from '@hitchbook/shared/schemas/invoices';
import type { Actor } from '../../common/auth/actor.js';
import { AppError, conflict } from '../../common/errors/app-error.js';
import { AuditService } from '../../core/audit.service.js';
import { APP_CONFIG, type AppConfig } from '../../core/config.js';
import { DB, type DbHandle } from '../../core/database.js';
import { invoiceScopeOf } from '../customer-portal/invoice-scope.js';
import { InvoiceViews } from '../invoices/invoice-views.service.js';
import { CURRENCY, STRIPE } from './stripe-client.js';

// A session about to lapse is not handed out again: the payer needs time to type a card.
const REUSE_MARGIN_SECONDS = 15 * 60;

export const cardsNotConfigured = () => new AppError('unavailable', 'Card payments are not configured.');

/** Opens a Stripe Checkout Session for an invoice's open balance; the amount only ever comes from the server. */
@Injectable()
export class CheckoutService {
  constructor(
    @Inject(DB) private readonly dbh: DbHandle,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    @Inject(STRIPE) private readonly stripe: Stripe | null,
    @Inject(InvoiceViews) private readonly views: InvoiceViews,
    @Inject(AuditService) private readonly audit: AuditService,
  ) {}

  async open(actor: Actor, invoiceId: string): Promise<CheckoutDto> {
    const stripe = this.stripe;
    if (!stripe) throw cardsNotConfigured();
    const scope = invoiceScopeOf(actor);
    return this.dbh.db.transaction(async (tx) => {
      // Two clicks on Pay take turns, so the second finds the session the first opened.
      await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${`checkout:${invoiceId}`}))`);
      const invoice = await this.views.detailOrThrow(scope, invoiceId, tx);
      if (invoice.kind !== 'invoice' || invoice.status !== 'issued') throw conflict('Only an issued invoice can be paid.');
      const balance = new Dec(invoice.balance);
      if (balance.lte(0)) throw conflict('This invoice is paid; nothing is left to pay.');
      const amountCents = toStripeCentsOrThrow(balance);

      const forAmount = and(eq(checkoutSessions.operationId, scope.operationId), eq(checkoutSessions.invoiceId, invoiceId), eq(checkoutSessions.amountCents, amountCents));
      const [open] = await tx
        .select()
        .from(checkoutSessions)
        .where(and(forAmount, eq(checkoutSessions.status, 'open'), gt(checkoutSessions.expiresAt, sql`now() + make_interval(secs => ${REUSE_MARGIN_SECONDS})`)))
        .orderBy(desc(checkoutSessions.createdAt))
        .limit(1);
      if (open) return { url: open.url, amount: toMoneyString(balance), currency: open.currency, expiresAt: open.expiresAt?.toISOString() ?? null };

      // One key per invoice, amount and attempt: a retried request gets the same session from Stripe,
      // and a new amount (after a part payment) or a lapsed session gets a new one.
      const [earlier] = await tx.select({ n: count() }).from(checkoutSessions).where(forAmount);
      const idempotencyKey = `checkout:${scope.operationId}:${invoiceId}:${amountCents}:${earlier?.n ?? 0}`;
      const metadata = { operationId: scope.operationId, invoiceId };
      let session: Stripe.Checkout.Session;
      try {
        session = await stripe.checkout.sessions.create(
          {
            mode: 'payment',
            line_items: [
              {
                quantity: 1,
                price_data: {
                  currency: CURRENCY,
                  unit_amount: amountCents,
                  product_data: { name: `Invoice ${invoice.numberLabel}`, description: `${invoice.issuer.name}, open balance` },
                },
              },
            ],
            metadata,
            client_reference_id: invoiceId,
            payment_intent_data: { metadata, description: `Invoice ${invoice.numberLabel}` },
            ...(invoice.party.email ? { customer_email: invoice.party.email } : {}),
            success_url: `${this.config.appUrl}/pay/${invoiceId}?checkout=success&session={CHECKOUT_SESSION_ID}`,
            cancel_url: `${this.config.appUrl}/pay/${invoiceId}?checkout=cancelled`,
          },
          { idempotencyKey },
        );
      } catch (err) {
        if (err instanceof Stripe.errors.StripeIdempotencyError) throw conflict('A payment for this invoice is being opened already; try again in a moment.');
        if (err instanceof Stripe.errors.StripeConnectionError || err instanceof Stripe.errors.StripeAPIError) {
          throw new AppError('unavailable', 'Card payments are unavailable right now; try again shortly.');
        }
        throw err;
      }
      if (!session.url) throw new AppError('unavailable', 'Card payments are unavailable right now; try again shortly.');
      const expiresAt = new Date(session.expires_at * 1000);
      await tx
        .insert(checkoutSessions)
        .values({ operationId: scope.operationId, invoiceId, stripeSessionId: session.id, amountCents, currency: CURRENCY, url: session.url, createdBy: actor.userId, expiresAt })
        .onConflictDoNothing({ target: checkoutSessions.stripeSessionId });
      await this.audit.record(this.audit.byActor(actor, 'checkout.opened', 'invoice', invoiceId, { after: { session: session.id, amountCents } }), tx);
      return { url: session.url, amount: toMoneyString(balance), currency: CURRENCY, expiresAt: expiresAt.toISOString() };
    });
  }
}
