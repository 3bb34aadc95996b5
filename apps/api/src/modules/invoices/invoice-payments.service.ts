import { Inject, Injectable } from '@nestjs/common';
import type { Decimal } from 'decimal.js';
import { and, eq, sql } from 'drizzle-orm';
import type Stripe from 'stripe';
import { paymentRefunds, payments, type Executor, type Invoice, type Payment } from '@hitchbook/db';
import { Dec } from '@hitchbook/shared/decimal';
import { formatMoney, fromCents, toMoneyString } from '@hitchbook/shared/money';
import type { ManualPayment, ManualPaymentResultDto, PaymentDto } from '@hitchbook/shared/schemas/invoices';
import type { Actor } from '../../common/auth/actor.js';
import { conflict, invalid, notFound } from '../../common/errors/app-error.js';
import { AuditService } from '../../core/audit.service.js';
import { DB, type DbHandle } from '../../core/database.js';
import { invoiceScopeOf, wholeOperation } from '../customer-portal/invoice-scope.js';
import { expireOpenSessions } from '../payments/open-sessions.js';
import { STRIPE } from '../payments/stripe-client.js';
import { toPaymentDto, toSummaryDto } from './invoice.dto.js';
import { InvoiceMail } from './invoice-mail.js';
import { InvoicesRepository } from './invoices.repository.js';

export interface CardPayment {
  operationId: string;
  invoiceId: string;
  amount: string;
  receivedOn: string;
  paymentIntentId: string;
  checkoutSessionId: string;
}

export type CardPaymentOutcome = { recorded: true; paymentId: string; overpaid: boolean } | { recorded: false };

/** A refund Stripe made (or confirmed by its event) of a card payment, found by the payment's PaymentIntent. */
export interface CardRefund {
  stripeRefundId: string;
  paymentIntentId: string;
  amountCents: number;
  reason: string | null;
  createdBy: string | null;
}

export type CardRefundOutcome = { recorded: true; payment: Payment; invoice: Invoice } | { recorded: false; outcome: string };

const REFUND_DUE_VOID = 'Paid by card after the invoice was voided; refund it to the payer.';
const refundDueOverpaid = (excess: Decimal) => `Paid ${formatMoney(excess)} more than was open; refund the difference to the payer.`;

/** Money received against an invoice: by cheque, cash or transfer from the owner, by card from the webhook. */
@Injectable()
export class InvoicePaymentsService {
  constructor(
    @Inject(DB) private readonly dbh: DbHandle,
    @Inject(InvoicesRepository) private readonly repo: InvoicesRepository,
    @Inject(InvoiceMail) private readonly mail: InvoiceMail,
    @Inject(AuditService) private readonly audit: AuditService,
    @Inject(STRIPE) private readonly stripe: Stripe | null,
  ) {}

  async list(actor: Actor, invoiceId: string): Promise<PaymentDto[]> {
    const scope = invoiceScopeOf(actor);
    if (!(await this.repo.summary(scope, invoiceId))) throw notFound('No such invoice.');
    return (await this.repo.payments(scope.operationId, invoiceId)).map(toPaymentDto);
  }

  /** Never more than the open balance: an overpayment is a typing error here, not money to keep. */
  async recordManual(actor: Actor, invoiceId: string, input: ManualPayment): Promise<ManualPaymentResultDto> {
    const scope = wholeOperation(actor.operationId);
    return this.dbh.db.transaction(async (tx) => {
      const invoice = await this.repo.lock(scope.operationId, invoiceId, tx);
      if (!invoice) throw notFound('No such invoice.');
      if (invoice.kind !== 'invoice' || invoice.status !== 'issued') throw conflict('Payments are recorded only against an issued invoice.');
      const balance = new Dec((await this.repo.summary(scope, invoiceId, tx))!.balance);
      if (input.amount.gt(balance)) throw invalid('amount', `At most the open balance of ${toMoneyString(balance.isNegative() ? 0 : balance)}.`);
      const today = await todayOf(tx);
      if (input.receivedOn > today) throw invalid('receivedOn', 'A payment cannot be received in the future.');
      // A pay link for the old balance would take too much once this is booked.
      await expireOpenSessions(this.stripe, tx, scope.operationId, invoiceId, { bestEffort: true });
      const [payment] = await tx
        .insert(payments)
        .values({
          operationId: scope.operationId,
          invoiceId,
          method: input.method,
          amount: input.amount.toFixed(2),
          receivedOn: input.receivedOn,
          reference: input.reference ?? null,
          createdBy: actor.userId,
        })
        .returning();
      await this.repo.update(scope.operationId, invoiceId, { amountPaid: new Dec(invoice.amountPaid).plus(input.amount).toFixed(2), version: invoice.version + 1 }, tx);
      await this.audit.record(this.audit.byActor(actor, 'payment.recorded', 'invoice', invoiceId, { after: toPaymentDto(payment!) }), tx);
      await this.mail.queueReceipt(scope.operationId, payment!.id, tx);
      return { payment: toPaymentDto(payment!), invoice: toSummaryDto((await this.repo.summary(scope, invoiceId, tx))!) };
    });
  }

  /**
   * A card payment confirmed by Stripe, recorded once per payment intent (a unique key). The money has
   * been taken, so it is recorded even when the invoice was paid otherwise or voided meanwhile; the
   * outcome says so and the audit log keeps it for the owner to refund.
   */
  async recordCard(card: CardPayment, tx: Executor): Promise<CardPaymentOutcome> {
    const invoice = await this.repo.lock(card.operationId, card.invoiceId, tx);
    if (!invoice) return { recorded: false };
    const [payment] = await tx
      .insert(payments)
      .values({
        operationId: card.operationId,
        invoiceId: card.invoiceId,
        method: 'card',
        amount: card.amount,
        receivedOn: card.receivedOn,
        reference: card.paymentIntentId,
        stripePaymentIntentId: card.paymentIntentId,
        stripeCheckoutSessionId: card.checkoutSessionId,
      })
      .onConflictDoNothing({ target: payments.stripePaymentIntentId })
      .returning();
    if (!payment) return { recorded: false };
    const balance = new Dec((await this.repo.summary(wholeOperation(card.operationId), card.invoiceId, tx))!.balance);
    const refundDue = invoice.status !== 'issued' ? REFUND_DUE_VOID : new Dec(card.amount).gt(balance) ? refundDueOverpaid(new Dec(card.amount).minus(Dec.max(balance, 0))) : null;
    const overpaid = refundDue !== null;
    if (refundDue) await tx.update(payments).set({ refundDue }).where(eq(payments.id, payment.id));
    await this.repo.update(card.operationId, card.invoiceId, { amountPaid: new Dec(invoice.amountPaid).plus(card.amount).toFixed(2), version: invoice.version + 1 }, tx);
    await this.audit.record(
      { operationId: card.operationId, actorUserId: null, action: overpaid ? 'payment.card-overpaid' : 'payment.card-received', entityType: 'invoice', entityId: card.invoiceId, after: { ...toPaymentDto(payment), refundDue } },
      tx,
    );
    await this.mail.queueReceipt(card.operationId, payment.id, tx);
    return { recorded: true, paymentId: payment.id, overpaid };
  }

  /**
   * Books a card refund once per Stripe refund id, whether it comes from the owner's request or from
   * Stripe's event: the payment keeps what was handed back, the invoice counts the rest as paid (so a
   * paid invoice is partly paid or open again), and a refund that was due is cleared once made.
   */
  async recordRefund(refund: CardRefund, tx: Executor): Promise<CardRefundOutcome> {
    const [found] = await tx.select().from(payments).where(eq(payments.stripePaymentIntentId, refund.paymentIntentId));
    if (!found) return { recorded: false, outcome: 'refund of a payment not recorded here' };
    const invoice = (await this.repo.lock(found.operationId, found.invoiceId, tx))!;
    const [payment] = await tx.select().from(payments).where(and(eq(payments.operationId, found.operationId), eq(payments.id, found.id))).for('update');
    const [known] = await tx.select({ id: paymentRefunds.id }).from(paymentRefunds).where(eq(paymentRefunds.stripeRefundId, refund.stripeRefundId));
    if (known) return { recorded: false, outcome: 'refund already recorded' };
    const amount = fromCents(refund.amountCents);
    const refunded = new Dec(payment!.amountRefunded).plus(amount);
    if (refunded.gt(payment!.amount)) return { recorded: false, outcome: `mismatch: refunds of ${toMoneyString(refunded)} exceed the payment of ${payment!.amount}` };
    await tx.insert(paymentRefunds).values({
      operationId: payment!.operationId,
      paymentId: payment!.id,
      stripeRefundId: refund.stripeRefundId,
      amount: amount.toFixed(2),
      reason: refund.reason,
      createdBy: refund.createdBy,
    });
    const updatedInvoice = await this.repo.update(invoice.operationId, invoice.id, { amountPaid: new Dec(invoice.amountPaid).minus(amount).toFixed(2), version: invoice.version + 1 }, tx);
    const balance = new Dec((await this.repo.summary(wholeOperation(invoice.operationId), invoice.id, tx))!.balance);
    const stillDue = payment!.refundDue !== null && refunded.lt(payment!.amount) && (invoice.status !== 'issued' || balance.lt(0));
    const [updated] = await tx
      .update(payments)
      .set({
        amountRefunded: refunded.toFixed(2),
        status: refunded.eq(payment!.amount) ? 'refunded' : 'succeeded',
        refundDue: stillDue ? (invoice.status === 'issued' ? refundDueOverpaid(balance.neg()) : payment!.refundDue) : null,
      })
      .where(eq(payments.id, payment!.id))
      .returning();
    await this.audit.record(
      {
        operationId: invoice.operationId,
        actorUserId: refund.createdBy,
        action: 'payment.refunded',
        entityType: 'invoice',
        entityId: invoice.id,
        before: { amountRefunded: payment!.amountRefunded },
        after: { payment: payment!.id, refund: refund.stripeRefundId, amount: amount.toFixed(2), amountRefunded: refunded.toFixed(2) },
      },
      tx,
    );
    return { recorded: true, payment: updated!, invoice: updatedInvoice };
  }
}

async function todayOf(tx: Executor): Promise<string> {
  const result = await tx.execute<{ today: string }>(sql`select current_date::text as today`);
  return result.rows[0]!.today;
}
