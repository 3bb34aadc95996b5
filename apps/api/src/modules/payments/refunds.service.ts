import { Inject, Injectable } from '@nestjs/common';
import type { Decimal } from 'decimal.js';
import { and, eq } from 'drizzle-orm';
import Stripe from 'stripe';
import { payments, type Executor } from '@hitchbook/db';
import { Dec } from '@hitchbook/shared/decimal';
import { toMoneyString, toStripeCentsOrThrow } from '@hitchbook/shared/money';
import type { ManualPaymentResultDto, PaymentRefundInput } from '@hitchbook/shared/schemas/invoices';
import type { Actor } from '../../common/auth/actor.js';
import { AppError, conflict, invalid, notFound } from '../../common/errors/app-error.js';
import { DB, type DbHandle } from '../../core/database.js';
import { wholeOperation } from '../customer-portal/invoice-scope.js';
import { toPaymentDto, toSummaryDto } from '../invoices/invoice.dto.js';
import { InvoicePaymentsService } from '../invoices/invoice-payments.service.js';
import { InvoicesRepository } from '../invoices/invoices.repository.js';
import { cardsNotConfigured } from './checkout.service.js';
import { STRIPE } from './stripe-client.js';

/** The owner hands card money back through Stripe; the refund is booked at once and Stripe's event about it finds it booked. */
@Injectable()
export class RefundsService {
  constructor(
    @Inject(DB) private readonly dbh: DbHandle,
    @Inject(STRIPE) private readonly stripe: Stripe | null,
    @Inject(InvoicesRepository) private readonly repo: InvoicesRepository,
    @Inject(InvoicePaymentsService) private readonly payments: InvoicePaymentsService,
  ) {}

  async refund(actor: Actor, invoiceId: string, paymentId: string, input: PaymentRefundInput, idempotencyKey?: string): Promise<ManualPaymentResultDto> {
    const stripe = this.stripe;
    if (!stripe) throw cardsNotConfigured();
    const operationId = actor.operationId;
    return this.dbh.db.transaction(async (tx) => {
      const invoice = await this.repo.lock(operationId, invoiceId, tx);
      if (!invoice) throw notFound('No such invoice.');
      const [payment] = await tx.select().from(payments).where(and(eq(payments.operationId, operationId), eq(payments.invoiceId, invoiceId), eq(payments.id, paymentId)));
      if (!payment) throw notFound('No such payment on this invoice.');
      if (payment.method !== 'card' || !payment.stripePaymentIntentId) {
        throw conflict('Only card payments are refunded here; hand back a cheque, cash or transfer yourself and correct the invoice with a credit note.');
      }
      const left = new Dec(payment.amount).minus(payment.amountRefunded);
      if (left.lte(0)) throw conflict('This payment has been refunded in full already.');
      const amount = input.amount ?? (await this.suggested(operationId, invoiceId, left, payment.refundDue !== null, tx));
      if (amount.gt(left)) throw invalid('amount', `At most the ${toMoneyString(left)} not yet refunded of this payment.`);

      const amountCents = toStripeCentsOrThrow(amount);
      // Without a key from the client, one per payment, amount refunded so far and amount: a retried
      // request gets Stripe's first answer, and a later refund of the same size is a new one.
      const key = idempotencyKey
        ? `refund:${operationId}:${idempotencyKey}`
        : `refund:${payment.id}:${toStripeCentsOrThrow(new Dec(payment.amountRefunded))}:${amountCents}`;
      let refund: Stripe.Refund;
      try {
        refund = await stripe.refunds.create(
          { payment_intent: payment.stripePaymentIntentId, amount: amountCents, reason: 'requested_by_customer', metadata: { operationId, invoiceId, paymentId } },
          { idempotencyKey: key },
        );
      } catch (err) {
        if (err instanceof Stripe.errors.StripeInvalidRequestError || err instanceof Stripe.errors.StripeIdempotencyError) throw conflict(`Stripe refused the refund: ${err.message}`);
        if (err instanceof Stripe.errors.StripeError) throw new AppError('unavailable', 'Card refunds are unavailable right now; nothing was refunded. Try again shortly.');
        throw err;
      }
      const booked = await this.payments.recordRefund(
        { stripeRefundId: refund.id, paymentIntentId: payment.stripePaymentIntentId, amountCents: refund.amount, reason: input.reason ?? null, createdBy: actor.userId },
        tx,
      );
      const after = booked.recorded ? booked.payment : (await tx.select().from(payments).where(eq(payments.id, payment.id)))[0]!;
      return { payment: toPaymentDto(after), invoice: toSummaryDto((await this.repo.summary(wholeOperation(operationId), invoiceId, tx))!) };
    });
  }

  /** Without an amount: what is over the invoice when the payment overpaid it, else all that is left of the payment. */
  private async suggested(operationId: string, invoiceId: string, left: Decimal, due: boolean, tx: Executor): Promise<Decimal> {
    if (!due) return left;
    const balance = new Dec((await this.repo.summary(wholeOperation(operationId), invoiceId, tx))!.balance);
    return balance.lt(0) ? Dec.min(balance.neg(), left) : left;
  }
}
