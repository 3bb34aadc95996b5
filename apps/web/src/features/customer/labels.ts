import dayjs from 'dayjs';
import type { InvoiceState, PaymentMethod } from '@hitchbook/shared/schemas/invoices';

/** The states in a payer's words: "Open" is what they still have to pay. */
export const STATE_LABELS: Record<InvoiceState, string> = {
  draft: 'Draft',
  issued: 'Open',
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

/** "May 2, 2026", from a calendar day (YYYY-MM-DD) or an instant. */
export function formatDay(iso: string): string {
  return dayjs(iso).format('MMM D, YYYY');
}
