import dayjs from 'dayjs';
import type { InvoiceLineKind, InvoiceState, PaymentMethod } from '@hitchbook/shared/schemas/invoices';

export const STATE_LABELS: Record<InvoiceState, string> = {
  draft: 'Draft',
  issued: 'Issued',
  'partly-paid': 'Partly paid',
  paid: 'Paid',
  overdue: 'Overdue',
  void: 'Void',
};

export const STATE_BADGES: Record<InvoiceState, { color: string; variant: 'light' | 'filled' | 'outline' }> = {
  draft: { color: 'slate', variant: 'light' },
  issued: { color: 'harbor', variant: 'light' },
  'partly-paid': { color: 'clay', variant: 'light' },
  paid: { color: 'harbor', variant: 'filled' },
  overdue: { color: 'red', variant: 'filled' },
  void: { color: 'slate', variant: 'outline' },
};

export const METHOD_LABELS: Record<PaymentMethod, string> = { card: 'Card', cheque: 'Cheque', cash: 'Cash', transfer: 'Bank transfer' };

/** What a line that is not a work entry is, in the words printed on the invoice. */
export const LINE_KIND_LABELS: Record<InvoiceLineKind, string> = {
  work: 'Work',
  minimum: 'Minimum charge',
  travel: 'Travel',
  'fuel-adjustment': 'Fuel adjustment',
  labour: 'Operator labour',
  adjustment: 'Added line',
  discount: 'Discount',
};

/** "May 2, 2026", from a calendar day (YYYY-MM-DD) or an instant. */
export function formatDay(iso: string): string {
  return dayjs(iso).format('MMM D, YYYY');
}
