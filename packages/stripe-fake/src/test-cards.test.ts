import { describe, expect, it } from 'vitest';
import { cardFromNumber, cardFromPaymentMethod, INVALID_NUMBER, issuerResponse, passesLuhn, type TestCard } from './test-cards.js';

describe('test cards', () => {
  it.each(['4242424242424242', '4000056655665556', '5555555555554444', '2223003122003222', '5200828282828210', '378282246310005', '6011111111111117', '4000000000000002', '4000000000009995', '4000000000009987', '4000000000009979', '4000000000000069', '4000000000000127', '4000000000000119'])(
    'Stripe documents %s, so it passes the Luhn check',
    (number) => expect(passesLuhn(number)).toBe(true),
  );

  it('refuses a number with one digit changed, or that is not a card number at all', () => {
    expect(cardFromNumber('4242 4242 4242 4241')).toBe(INVALID_NUMBER);
    expect(cardFromNumber('4242')).toBe(INVALID_NUMBER);
    expect(cardFromNumber('4242-4242-4242-424x')).toBe(INVALID_NUMBER);
  });

  it('reads spaces and dashes as a payer types them, with brand and last four digits', () => {
    expect(cardFromNumber('3782-822463-10005')).toEqual({ number: '378282246310005', brand: 'amex', last4: '0005', funding: 'credit' });
    expect(cardFromNumber('2223 0031 2200 3222')).toMatchObject({ brand: 'mastercard' });
    expect(cardFromNumber('4000 0566 5566 5556')).toMatchObject({ brand: 'visa', funding: 'debit' });
  });

  it('maps the pm_card_ tokens to their cards and the issuer answers to the documented declines', () => {
    expect(issuerResponse(cardFromPaymentMethod('pm_card_visa')!)).toBeNull();
    expect(issuerResponse(cardFromPaymentMethod('pm_card_chargeDeclinedExpiredCard')!)).toMatchObject({ code: 'expired_card' });
    expect(issuerResponse(cardFromPaymentMethod('pm_card_chargeDeclinedProcessingError')!)).toMatchObject({ code: 'processing_error' });
    expect(issuerResponse(cardFromNumber('4000000000009979') as TestCard)).toMatchObject({ code: 'card_declined', decline_code: 'stolen_card' });
    expect(cardFromPaymentMethod('pm_card_unheard_of')).toBeUndefined();
  });
});
