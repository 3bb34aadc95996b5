/** Why a card payment failed, in the fields of Stripe's card_error. */
export interface CardFailure {
  code: string;
  decline_code?: string;
  message: string;
  param?: string;
}

export interface TestCard {
  number: string;
  brand: 'visa' | 'mastercard' | 'amex' | 'discover' | 'unknown';
  last4: string;
  funding: 'credit' | 'debit';
}

const declined = (decline_code: string, message = 'Your card was declined.'): CardFailure => ({ code: 'card_declined', decline_code, message });

/** Stripe's documented test card numbers that fail, and how (docs.stripe.com/testing, "Declined payments"). */
const FAILING_CARDS: Record<string, CardFailure> = {
  '4000000000000002': declined('generic_decline'),
  '4000000000009995': declined('insufficient_funds', 'Your card has insufficient funds.'),
  '4000000000009987': declined('lost_card'),
  '4000000000009979': declined('stolen_card'),
  '4000000000000069': { code: 'expired_card', decline_code: 'expired_card', message: 'Your card has expired.', param: 'exp_month' },
  '4000000000000127': { code: 'incorrect_cvc', decline_code: 'incorrect_cvc', message: "Your card's security code is incorrect.", param: 'cvc' },
  '4000000000000119': { code: 'processing_error', decline_code: 'processing_error', message: 'An error occurred while processing your card. Try again in a little bit.' },
};

/** Stripe's documented test card numbers that succeed (docs.stripe.com/testing, "Cards by brand"). */
const SUCCEEDING_CARDS: Record<string, TestCard['funding']> = {
  '4242424242424242': 'credit',
  '4000056655665556': 'debit',
  '5555555555554444': 'credit',
  '2223003122003222': 'credit',
  '5200828282828210': 'debit',
  '378282246310005': 'credit',
  '6011111111111117': 'credit',
};

/** Test mode refuses any other number that passes the checksum, as Stripe does with a real card. */
const LIVE_CARD_IN_TEST_MODE = declined(
  'test_mode_live_card',
  'Your card was declined. Your request was in test mode, but used a non test (live) card. For a list of valid test cards, visit: https://stripe.com/docs/testing.',
);

/** Stripe's test PaymentMethod ids and the test card each one stands for. */
const PAYMENT_METHOD_TOKENS: Record<string, string> = {
  pm_card_visa: '4242424242424242',
  pm_card_visa_debit: '4000056655665556',
  pm_card_mastercard: '5555555555554444',
  pm_card_amex: '378282246310005',
  pm_card_discover: '6011111111111117',
  pm_card_chargeDeclined: '4000000000000002',
  pm_card_chargeDeclinedInsufficientFunds: '4000000000009995',
  pm_card_chargeDeclinedLostCard: '4000000000009987',
  pm_card_chargeDeclinedStolenCard: '4000000000009979',
  pm_card_chargeDeclinedExpiredCard: '4000000000000069',
  pm_card_chargeDeclinedIncorrectCvc: '4000000000000127',
  pm_card_chargeDeclinedProcessingError: '4000000000000119',
};

export const INVALID_NUMBER: CardFailure = { code: 'invalid_number', message: 'Your card number is invalid.', param: 'number' };

/** The card behind a typed number, or the invalid_number failure when it is not a card number at all. */
export function cardFromNumber(typed: string): TestCard | CardFailure {
  const number = typed.replace(/[\s-]/g, '');
  if (!/^\d{12,19}$/.test(number) || !passesLuhn(number)) return INVALID_NUMBER;
  return { number, brand: brandOf(number), last4: number.slice(-4), funding: SUCCEEDING_CARDS[number] ?? 'credit' };
}

/** The card behind a test PaymentMethod id such as pm_card_visa, or undefined when it is not one. */
export function cardFromPaymentMethod(id: string): TestCard | undefined {
  const number = PAYMENT_METHOD_TOKENS[id];
  return number === undefined ? undefined : (cardFromNumber(number) as TestCard);
}

/** What the issuer says to a charge on this card: null for approved. */
export function issuerResponse(card: TestCard): CardFailure | null {
  const failure = FAILING_CARDS[card.number];
  if (failure) return failure;
  return SUCCEEDING_CARDS[card.number] ? null : LIVE_CARD_IN_TEST_MODE;
}

export function isCardFailure<T extends object>(value: T | CardFailure): value is CardFailure {
  return 'code' in value;
}

export function passesLuhn(digits: string): boolean {
  let sum = 0;
  for (let i = 0; i < digits.length; i++) {
    let d = Number(digits[digits.length - 1 - i]);
    if (i % 2 === 1) {
      d *= 2;
      if (d > 9) d -= 9;
    }
    sum += d;
  }
  return sum % 10 === 0;
}

function brandOf(number: string): TestCard['brand'] {
  if (number.startsWith('4')) return 'visa';
  if (/^3[47]/.test(number)) return 'amex';
  if (/^(5[1-5]|2(2[2-9]|[3-6]\d|7[01]|720))/.test(number)) return 'mastercard';
  if (/^(6011|65)/.test(number)) return 'discover';
  return 'unknown';
}
