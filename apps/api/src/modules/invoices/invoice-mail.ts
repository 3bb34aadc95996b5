import { Inject, Injectable, type OnModuleInit } from '@nestjs/common';
import type { Executor } from '@hitchbook/db';
import { Dec } from '@hitchbook/shared/decimal';
import { formatMoney } from '@hitchbook/shared/money';
import type { InvoiceDto } from '@hitchbook/shared/schemas/invoices';
import { APP_CONFIG, type AppConfig } from '../../core/config.js';
import { deliverOrThrow } from '../../core/jobs.mail.js';
import { JobsService } from '../../core/jobs.service.js';
import { MailService } from '../../core/mail.service.js';
import { wholeOperation } from '../customer-portal/invoice-scope.js';
import { renderInvoicePdf } from './invoice-pdf.js';
import { InvoiceViews } from './invoice-views.service.js';
import { InvoicesRepository } from './invoices.repository.js';

export const INVOICE_MAIL_QUEUE = 'invoice-mail';
export const RECEIPT_MAIL_QUEUE = 'receipt-mail';

interface InvoiceMailJob {
  operationId: string;
  invoiceId: string;
  to: string;
}

interface ReceiptMailJob {
  operationId: string;
  paymentId: string;
}

/**
 * The invoice e-mail (PDF attached, pay link) and the payment receipt, both sent from the job queue.
 * A job carries ids only: the mail is built from the stored, frozen invoice when it is sent, so a retry
 * an hour later sends the same document.
 */
@Injectable()
export class InvoiceMail implements OnModuleInit {
  constructor(
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    @Inject(JobsService) private readonly jobs: JobsService,
    @Inject(MailService) private readonly mail: MailService,
    @Inject(InvoiceViews) private readonly views: InvoiceViews,
    @Inject(InvoicesRepository) private readonly repo: InvoicesRepository,
  ) {}

  onModuleInit(): void {
    const retries = { retryLimit: this.config.jobs.mailRetryLimit, retryDelaySeconds: this.config.jobs.mailRetryDelaySeconds, expireInSeconds: 180 };
    this.jobs.register<InvoiceMailJob>({ name: INVOICE_MAIL_QUEUE, ...retries, handle: (job) => this.sendInvoice(job) });
    this.jobs.register<ReceiptMailJob>({ name: RECEIPT_MAIL_QUEUE, ...retries, handle: (job) => this.sendReceipt(job) });
  }

  queueInvoice(operationId: string, invoiceId: string, to: string, tx: Executor): Promise<string> {
    return this.jobs.send<InvoiceMailJob>(INVOICE_MAIL_QUEUE, { operationId, invoiceId, to }, tx);
  }

  queueReceipt(operationId: string, paymentId: string, tx: Executor): Promise<string> {
    return this.jobs.send<ReceiptMailJob>(RECEIPT_MAIL_QUEUE, { operationId, paymentId }, tx);
  }

  private async sendInvoice(job: InvoiceMailJob): Promise<void> {
    const invoice = await this.views.detailOrThrow(wholeOperation(job.operationId), job.invoiceId);
    const pdf = await renderInvoicePdf(invoice);
    const document = invoice.kind === 'credit-note' ? 'Credit note' : 'Invoice';
    await deliverOrThrow(this.mail, {
      to: job.to,
      subject: `${document} ${invoice.numberLabel} from ${invoice.issuer.name}`,
      text: invoiceText(invoice),
      attachments: [{ filename: `${invoice.numberLabel}.pdf`, content: pdf, contentType: 'application/pdf' }],
    });
  }

  private async sendReceipt(job: ReceiptMailJob): Promise<void> {
    const payment = await this.repo.payment(job.operationId, job.paymentId);
    if (!payment) return;
    const invoice = await this.views.detailOrThrow(wholeOperation(job.operationId), payment.invoiceId);
    // Nobody to tell: the receipt is also visible on the invoice itself.
    if (!invoice.party.email) return;
    const how = payment.method === 'card' ? 'by card' : `by ${payment.method}`;
    await deliverOrThrow(this.mail, {
      to: invoice.party.email,
      subject: `Payment received for invoice ${invoice.numberLabel}`,
      text:
        `Hello ${invoice.party.name},\n\n` +
        `${invoice.issuer.name} received ${formatMoney(payment.amount)} ${how} on ${payment.receivedOn} for invoice ${invoice.numberLabel}. Thank you.\n\n` +
        (invoice.state === 'paid' ? 'The invoice is now paid in full.\n' : `${formatMoney(invoice.balance)} remains open on it.\n`),
    });
  }
}

function invoiceText(invoice: InvoiceDto): string {
  const hello = `Hello ${invoice.party.name},\n\n`;
  if (invoice.kind === 'credit-note') {
    return `${hello}Attached is credit note ${invoice.numberLabel} from ${invoice.issuer.name}, crediting ${formatMoney(new Dec(invoice.total).abs())} on invoice ${invoice.creditOf?.numberLabel}.\n`;
  }
  const period = invoice.periodFrom && invoice.periodTo ? ` for work from ${invoice.periodFrom} to ${invoice.periodTo}` : '';
  return (
    `${hello}Attached is invoice ${invoice.numberLabel} from ${invoice.issuer.name}${period}.\n` +
    `Amount due: ${formatMoney(invoice.balance)}${invoice.dueDate ? `, by ${invoice.dueDate}` : ''}.\n\n` +
    (invoice.payUrl ? `Pay by card online (sign in with your Hitchbook account to see the invoice and the work on it):\n${invoice.payUrl}\n\n` : '') +
    `Or pay by cheque or bank transfer to ${invoice.issuer.name}, quoting ${invoice.numberLabel}.\n`
  );
}
