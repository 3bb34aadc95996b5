import { Decimal } from 'decimal.js';
import { formatMoney } from '@hitchbook/shared/money';

/**
 * A payment may not exceed what is still owed. The server refuses it too; checking here tells
 * the owner before the request, in the same words. Null when the amount is fine or not a number
 * yet (the schema reports that).
 */
export function paymentOverBalance(amount: string, balance: string): string | null {
  let typed: Decimal;
  try {
    typed = new Decimal(amount.trim().replace(/^\$/, '').replace(/,/g, ''));
  } catch {
    return null;
  }
  return typed.gt(balance) ? `At most the open balance of ${formatMoney(balance)}.` : null;
}
