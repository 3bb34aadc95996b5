import { Decimal } from 'decimal.js';

/**
 * Where a payer stands on coming back from the card checkout:
 * - confirming: the card went through, but the processor's signed notice has not reached the server yet;
 * - paid: the server has recorded the payment;
 * - slow: still no notice after the wait, which can happen; the payer must not pay again;
 * - cancelled: they left the checkout (or gave up after a declined card) and nothing was charged.
 */
export type ReturnStatus = 'confirming' | 'paid' | 'slow' | 'cancelled';

/** How long the page keeps asking before it says the confirmation is slow. */
export const CONFIRM_WAIT_MS = 60_000;

export interface ReturnFacts {
  /** The `checkout` parameter the checkout sends the payer back with. */
  checkout: string | null;
  balance: string;
  waitedMs: number;
}

// The checkout always charges the whole open balance, so a balance of zero is the sign that the
// payment has been recorded; the page needs no payment id to know it.
export function paymentReturnStatus({ checkout, balance, waitedMs }: ReturnFacts): ReturnStatus {
  if (checkout !== 'success') return 'cancelled';
  if (new Decimal(balance).lte(0)) return 'paid';
  return waitedMs >= CONFIRM_WAIT_MS ? 'slow' : 'confirming';
}
