import { Decimal } from 'decimal.js';
import type { InvoiceSummaryDto } from '@hitchbook/shared/schemas/invoices';

/** Only an issued invoice with money still owed can be paid; a credit note or a void one cannot. */
export function canPay(invoice: Pick<InvoiceSummaryDto, 'kind' | 'status' | 'balance'>): boolean {
  return invoice.kind === 'invoice' && invoice.status === 'issued' && new Decimal(invoice.balance).gt(0);
}
