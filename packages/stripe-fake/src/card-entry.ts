import { cardFromNumber, isCardFailure, type CardFailure, type TestCard } from './test-cards.js';

export interface TypedCard {
  number: string;
  expiry: { month: number; year: number } | null;
  cvc: string;
}

/** "MM / YY", "MM/YYYY" and the like, as a payer types them; null when it is not an expiry date. */
export function parseExpiry(text: string): { month: number; year: number } | null {
  const match = /^\s*(\d{1,2})\s*\/\s*(\d{2}|\d{4})\s*$/.exec(text);
  if (!match) return null;
  const year = Number(match[2]);
  return { month: Number(match[1]), year: year < 100 ? 2000 + year : year };
}

/**
 * Checks what a payer typed the way Stripe's card form does before anything is charged:
 * the number's checksum, an expiry month that is not past, a CVC of the brand's length.
 */
export function checkTypedCard(typed: TypedCard, now = new Date()): { card: TestCard; expiry: { month: number; year: number } } | CardFailure {
  const card = cardFromNumber(typed.number);
  if (isCardFailure(card)) return card;
  const expiry = typed.expiry;
  if (!expiry) return { code: 'incomplete_expiry', message: "Your card's expiration date is incomplete.", param: 'exp_month' };
  if (expiry.month < 1 || expiry.month > 12) return { code: 'invalid_expiry_month', message: "Your card's expiration month is invalid.", param: 'exp_month' };
  const thisYear = now.getUTCFullYear();
  if (expiry.year < thisYear || (expiry.year === thisYear && expiry.month < now.getUTCMonth() + 1)) {
    return { code: 'invalid_expiry_year_past', message: "Your card's expiration date is in the past.", param: 'exp_year' };
  }
  const cvcLength = card.brand === 'amex' ? 4 : 3;
  if (!new RegExp(`^\\d{${cvcLength}}$`).test(typed.cvc.trim())) {
    return { code: 'incomplete_cvc', message: "Your card's security code is incomplete.", param: 'cvc' };
  }
  return { card, expiry };
}
