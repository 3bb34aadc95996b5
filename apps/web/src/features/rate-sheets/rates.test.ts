import { describe, expect, it } from 'vitest';
import { formatUnitRate } from './rates';

describe('rates on a sheet', () => {
  it('shows a rate stored to four places with its cents', () => {
    expect(formatUnitRate('18.5000', 'acre')).toBe('$18.50/acre');
  });

  it('keeps the places that matter instead of rounding them away', () => {
    expect(formatUnitRate('0.6525', 'mile')).toBe('$0.6525/mile');
    expect(formatUnitRate('1.125', 'load')).toBe('$1.125/load');
  });

  it('groups thousands', () => {
    expect(formatUnitRate('1250', 'each')).toBe('$1,250.00/each');
  });
});
