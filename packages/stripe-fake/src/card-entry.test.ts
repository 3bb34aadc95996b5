import { describe, expect, it } from 'vitest';
import { checkTypedCard, parseExpiry } from './card-entry.js';

const JUNE_2027 = new Date(Date.UTC(2027, 5, 15));

describe('typed card details', () => {
  it('reads expiry dates as payers type them', () => {
    expect(parseExpiry('12 / 29')).toEqual({ month: 12, year: 2029 });
    expect(parseExpiry('3/2031')).toEqual({ month: 3, year: 2031 });
    expect(parseExpiry('1229')).toBeNull();
  });

  it('takes the current month and refuses the one before', () => {
    expect(checkTypedCard({ number: '4242424242424242', expiry: { month: 6, year: 2027 }, cvc: '123' }, JUNE_2027)).toMatchObject({ card: { last4: '4242' } });
    expect(checkTypedCard({ number: '4242424242424242', expiry: { month: 5, year: 2027 }, cvc: '123' }, JUNE_2027)).toMatchObject({ code: 'invalid_expiry_year_past' });
    expect(checkTypedCard({ number: '4242424242424242', expiry: { month: 13, year: 2030 }, cvc: '123' }, JUNE_2027)).toMatchObject({ code: 'invalid_expiry_month' });
    expect(checkTypedCard({ number: '4242424242424242', expiry: null, cvc: '123' }, JUNE_2027)).toMatchObject({ code: 'incomplete_expiry' });
  });

  it('wants four CVC digits for American Express and three for the rest', () => {
    expect(checkTypedCard({ number: '378282246310005', expiry: { month: 1, year: 2030 }, cvc: '123' }, JUNE_2027)).toMatchObject({ code: 'incomplete_cvc' });
    expect(checkTypedCard({ number: '378282246310005', expiry: { month: 1, year: 2030 }, cvc: '1234' }, JUNE_2027)).toMatchObject({ card: { brand: 'amex' } });
    expect(checkTypedCard({ number: '4242424242424242', expiry: { month: 1, year: 2030 }, cvc: '1234' }, JUNE_2027)).toMatchObject({ code: 'incomplete_cvc' });
  });
});
