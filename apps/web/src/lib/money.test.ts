import { describe, expect, it } from 'vitest';
import { formatDecimal, formatMoney, formatRate, isDecimalText, perAcre } from './money';

describe('money formatting', () => {
  it('prints dollars with thousands separators and two decimals', () => {
    expect(formatMoney('13917.2237')).toBe('$13,917.22');
    expect(formatMoney('1234567')).toBe('$1,234,567.00');
    expect(formatMoney('0')).toBe('$0.00');
  });

  it('rounds half-up to the cent, not to the nearest even cent', () => {
    expect(formatMoney('2.345')).toBe('$2.35');
    expect(formatMoney('2.355')).toBe('$2.36');
  });

  it('handles values a binary float cannot hold exactly', () => {
    // 1.005 as a float is 1.00499999..., which would print as 1.00.
    expect(formatMoney('1.005')).toBe('$1.01');
  });

  it('puts the sign before the dollar sign and drops it for a rounded zero', () => {
    expect(formatMoney('-1797.734')).toBe('-$1,797.73');
    expect(formatMoney('-0.001')).toBe('$0.00');
  });

  it('formats a rate per unit', () => {
    expect(formatRate('86.9733', 'h')).toBe('$86.97/h');
  });

  it('formats quantities at the requested places', () => {
    expect(formatDecimal('21636.3636', 1)).toBe('21,636.4');
    expect(formatDecimal('7.92', 3)).toBe('7.920');
  });
});

describe('per-acre cost', () => {
  it('divides the hourly cost by the work rate (A3-29 tractor pulling a 30-ft cultivator: $4.02/acre)', () => {
    // Trade reference §6a: $86.97/h over 21.636 acres/h.
    expect(perAcre('86.97', '21.636')?.toFixed(2)).toBe('4.02');
  });

  it('gives no per-acre figure without a work rate', () => {
    expect(perAcre('86.97', '0')).toBeNull();
  });
});

describe('decimal text', () => {
  it('accepts plain decimals and rejects anything else', () => {
    expect(isDecimalText('150000')).toBe(true);
    expect(isDecimalText('3.00')).toBe(true);
    expect(isDecimalText('1e5')).toBe(false);
    expect(isDecimalText('12,000')).toBe(false);
    expect(isDecimalText('')).toBe(false);
  });
});
