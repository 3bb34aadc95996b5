import { Decimal } from 'decimal.js';
import type { Role } from '@hitchbook/shared/roles';
import { accessTo } from '../../lib/areas';
import type { InvoiceSummaryDto } from '@hitchbook/shared/schemas/invoices';

export interface InvoiceActions {
  editDraft: boolean;
  issue: boolean;
  deleteDraft: boolean;
  downloadPdf: boolean;
  send: boolean;
  recordPayment: boolean;
  creditNote: boolean;
  void: boolean;
  /** Card payments on the invoice may be refunded (by the owner, whatever state the invoice is in). */
  refund: boolean;
}

type InvoiceFacts = Pick<InvoiceSummaryDto, 'kind' | 'status' | 'total' | 'balance' | 'amountPaid' | 'amountCredited'>;

/**
 * Only the owner bills: the API refuses drafting, issuing, sending, payments, refunds, voids and
 * credit notes to everyone else, so the other money roles read and download.
 */
export function canBill(role: Role): boolean {
  return accessTo(role, 'invoices') === 'manage';
}

/** What the invoice page offers for this invoice in its present state. */
export function invoiceActionsFor(role: Role, invoice: InvoiceFacts): InvoiceActions {
  const owner = canBill(role);
  const draft = invoice.status === 'draft';
  const issued = invoice.status === 'issued';
  const isInvoice = invoice.kind === 'invoice';
  const owes = new Decimal(invoice.balance).gt(0);
  const untouched = new Decimal(invoice.amountPaid).eq(0) && new Decimal(invoice.amountCredited).eq(0);
  const leftToCredit = new Decimal(invoice.total).minus(invoice.amountCredited).gt(0);
  return {
    editDraft: owner && draft,
    issue: owner && draft,
    deleteDraft: owner && draft,
    downloadPdf: true,
    send: owner && issued,
    recordPayment: owner && issued && isInvoice && owes,
    // A paid invoice can still be corrected (and the difference refunded) with a credit note.
    creditNote: owner && issued && isInvoice && leftToCredit,
    // Once money was received or credited, the record stays and a credit note corrects it instead.
    void: owner && issued && untouched,
    refund: owner && isInvoice && invoice.status !== 'draft',
  };
}
