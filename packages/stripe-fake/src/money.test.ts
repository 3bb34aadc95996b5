import { describe, expect, it } from 'vitest';
import { formatAmount } from './money.js';

describe('formatAmount', () => {
  it('writes minor units with two decimals and thousands separators', () => {
    expect(formatAmount(124050, 'usd')).toBe('1,240.50 USD');
    expect(formatAmount(5, 'cad')).toBe('0.05 CAD');
    expect(formatAmount(99_999_999, 'eur')).toBe('999,999.99 EUR');
    expect(formatAmount(0, 'usd')).toBe('0.00 USD');
  });

  it('writes zero-decimal currencies in whole units', () => {
    expect(formatAmount(1500, 'jpy')).toBe('1,500 JPY');
  });
});
