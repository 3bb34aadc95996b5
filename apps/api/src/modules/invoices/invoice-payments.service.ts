import { Inject, Injectable } from '@nestjs/common';
import { sql } from 'drizzle-orm';
import { payments, type Executor } from '@hitchbook/db';
import { Dec } from '@hitchbook/shared/decimal';
import { toMoneyString } from '@hitchbook/shared/money';
import type { ManualPayment, ManualPaymentResultDto, PaymentDto } from '@hitchbook/shared/schemas/invoices';
import type { Actor } from '../../common/auth/actor.js';
import { conflict, invalid, notFound } from '../../common/errors/app-error.js';
import { AuditService } from '../../core/audit.service.js';
import { DB, type DbHandle } from '../../core/database.js';
import { invoiceScopeOf, wholeOperation } from '../customer-portal/invoice-scope.js';
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

/** Money received against an invoice: by cheque, cash or transfer from the owner, by card from the webhook. */
@Injectable()
export class InvoicePaymentsService {
  constructor(
    @Inject(DB) private readonly dbh: DbHandle,
    @Inject(InvoicesRepository) private readonly repo: InvoicesRepository,
    @Inject(InvoiceMail) private readonly mail: InvoiceMail,
    @Inject(AuditService) private readonly audit: AuditService,
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
    const overpaid = invoice.status !== 'issued' || new Dec(card.amount).gt(balance);
    await this.repo.update(card.operationId, card.invoiceId, { amountPaid: new Dec(invoice.amountPaid).plus(card.amount).toFixed(2), version: invoice.version + 1 }, tx);
    await this.audit.record(
      { operationId: card.operationId, actorUserId: null, action: overpaid ? 'payment.card-overpaid' : 'payment.card-received', entityType: 'invoice', entityId: card.invoiceId, after: toPaymentDto(payment) },
      tx,
    );
    await this.mail.queueReceipt(card.operationId, payment.id, tx);
    return { recorded: true, paymentId: payment.id, overpaid };
  }
}

async function todayOf(tx: Executor): Promise<string> {
  const result = await tx.execute<{ today: string }>(sql`select current_date::text as today`);
  return result.rows[0]!.today;
}
