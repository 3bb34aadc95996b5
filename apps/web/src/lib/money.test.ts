import { describe, expect, it } from 'vitest';
import { formatDecimal, formatRate, perAcre } from './money';

describe('quantity formatting', () => {
  it('prints quantities at the requested places with thousands separators', () => {
    expect(formatDecimal('21636.3636', 1)).toBe('21,636.4');
    expect(formatDecimal('7.92', 3)).toBe('7.920');
    expect(formatDecimal('1234567', 0)).toBe('1,234,567');
  });

  it('rounds half-up on decimal digits, not on a binary float', () => {
    // 1.005 as a float is 1.00499999..., which toFixed(2) would print as 1.00.
    expect(formatDecimal('1.005', 2)).toBe('1.01');
  });

  it('keeps the sign of a negative quantity and drops it for a rounded zero', () => {
    expect(formatDecimal('-1797.734', 2)).toBe('-1,797.73');
    expect(formatDecimal('-0.001', 2)).toBe('0.00');
  });
});

describe('rates', () => {
  it('formats a money figure per unit', () => {
    expect(formatRate('86.9733', 'h')).toBe('$86.97/h');
    expect(formatRate('13917.2237', 'yr')).toBe('$13,917.22/yr');
  });
});

describe('per-acre cost', () => {
  it('divides the hourly cost by the work rate (A3-29 tractor pulling a 30-ft cultivator: $4.02/acre)', () => {
    // Trade reference §6a: $86.97/h over 30 ft × 7 mph × 0.85 / 8.25 = 21.636 acres/h.
    expect(perAcre('86.97', '21.636')?.toFixed(2)).toBe('4.02');
  });

  it('gives no per-acre figure without a work rate', () => {
    expect(perAcre('86.97', '0')).toBeNull();
  });
});
