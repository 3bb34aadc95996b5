import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  addMoney,
  allocateOrThrow,
  formatMoney,
  fromCents,
  isWholeCents,
  multiplyMoney,
  parseMoneyOrThrow,
  roundToCent,
  toCentsOrThrow,
  toMoneyString,
  toStripeCentsOrThrow,
} from './money.js';

const centsArb = fc.bigInt({ min: -10_000_000_000n, max: 10_000_000_000n });

describe('money arithmetic', () => {
  it('adds amounts without binary drift', () => {
    expect(addMoney('0.10', '0.20', 0.3).toString()).toBe('0.6');
  });

  it('multiplies an amount by a rate exactly', () => {
    expect(multiplyMoney('19.99', '3').toString()).toBe('59.97');
  });

  it('rejects garbage with the field name in the message', () => {
    expect(() => parseMoneyOrThrow('12.3.4', 'fuelPrice')).toThrow(/fuelPrice/);
    expect(() => addMoney('1', Number.NaN)).toThrow(/finite/);
  });
});

describe('roundToCent', () => {
  // Half-up to the cent is the invoicing rule of the Hitchbook API contract
  // (common practice, no source).
  it.each([
    ['1.005', '1.01'],
    ['1.0049999', '1.00'],
    ['2.675', '2.68'],
    ['-1.005', '-1.01'],
    ['0.004', '0.00'],
  ])('rounds %s to %s', (input, expected) => {
    expect(roundToCent(input).toFixed(2)).toBe(expected);
  });

  it('keeps 2.675 at 2.68, which a binary float rounds down to 2.67', () => {
    expect(toMoneyString(2.675)).toBe('2.68');
  });
});

describe('formatMoney', () => {
  it.each([
    ['1234.5', '$1,234.50'],
    ['0', '$0.00'],
    ['999.999', '$1,000.00'],
    ['1234567.891', '$1,234,567.89'],
    ['-1234.5', '-$1,234.50'],
    ['-0.001', '$0.00'],
  ])('shows %s as %s', (input, expected) => {
    expect(formatMoney(input)).toBe(expected);
  });
});

describe('Stripe cents', () => {
  it('converts dollars to an integer number of cents', () => {
    expect(toStripeCentsOrThrow('1234.50')).toBe(123450);
    expect(toStripeCentsOrThrow('0.015')).toBe(2);
  });

  it('refuses amounts beyond the safe integer range', () => {
    expect(() => toStripeCentsOrThrow('90071992547409.92')).toThrow(/safe integer/);
  });

  it('round-trips any cent amount', () => {
    fc.assert(
      fc.property(centsArb, (cents) => {
        expect(toCentsOrThrow(fromCents(cents))).toBe(cents);
      }),
    );
  });

  it('rejects fractions of a cent where exact cents are required', () => {
    expect(isWholeCents('1.234')).toBe(false);
    expect(() => toCentsOrThrow('1.234')).toThrow(/whole number of cents/);
  });
});

describe('allocateOrThrow', () => {
  it('gives the leftover cent to the largest remainder', () => {
    // 100.00 by 1:1:1 -> 33.33 each plus one cent to the first (tie by order).
    expect(allocateOrThrow('100', [1, 1, 1]).map(String)).toEqual(['33.34', '33.33', '33.33']);
  });

  it('favours the part with the larger fraction, not the earlier one', () => {
    // 10.00 by 1:2 -> 3.333.. and 6.666..; the 0.667 remainder wins the cent.
    expect(allocateOrThrow('10', ['1', '2']).map(String)).toEqual(['3.33', '6.67']);
  });

  it('splits negative amounts symmetrically', () => {
    expect(allocateOrThrow('-100', [1, 1, 1]).map(String)).toEqual(['-33.34', '-33.33', '-33.33']);
  });

  it('gives nothing to a zero weight', () => {
    expect(allocateOrThrow('0.05', [0, 1, 1]).map(String)).toEqual(['0', '0.03', '0.02']);
  });

  it('rejects empty, all-zero and negative weights and sub-cent amounts', () => {
    expect(() => allocateOrThrow('1', [])).toThrow(/at least one/);
    expect(() => allocateOrThrow('1', [0, 0])).toThrow(/all be zero/);
    expect(() => allocateOrThrow('1', [1, -1])).toThrow(/negative/);
    expect(() => allocateOrThrow('1.001', [1])).toThrow(/cents/);
  });

  it('always sums exactly to the amount and keeps each part within a cent of its share', () => {
    fc.assert(
      fc.property(
        centsArb,
        fc.array(fc.integer({ min: 0, max: 1_000_000 }), { minLength: 1, maxLength: 12 }),
        fc.integer({ min: 0, max: 3 }),
        (cents, rawWeights, decimals) => {
          fc.pre(rawWeights.some((weight) => weight > 0));
          const weights = rawWeights.map((weight) => (weight / 10 ** decimals).toFixed(decimals));
          const amount = fromCents(cents);
          const parts = allocateOrThrow(amount, weights);
          expect(addMoney(...parts).eq(amount)).toBe(true);
          const weightSum = addMoney(...weights);
          parts.forEach((part, index) => {
            const exact = amount.times(weights[index]!).div(weightSum);
            expect(part.minus(exact).abs().lt('0.01')).toBe(true);
            expect(isWholeCents(part)).toBe(true);
          });
        },
      ),
    );
  });
});
