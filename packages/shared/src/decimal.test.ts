import { describe, expect, it } from 'vitest';
import { Decimal } from 'decimal.js';
import { fixed, parseDecimalOrThrow } from './decimal.js';
import { ComputationError } from './errors.js';

describe('parseDecimalOrThrow', () => {
  it('keeps a decimal string exactly, beyond float precision', () => {
    expect(parseDecimalOrThrow('12345678901234567.89').toFixed(2)).toBe('12345678901234567.89');
  });

  it('reads a JSON number by its shortest decimal form, not its binary value', () => {
    expect(parseDecimalOrThrow(0.1).plus(parseDecimalOrThrow(0.2)).toString()).toBe('0.3');
  });

  it.each([NaN, Infinity, -Infinity])('rejects the number %s', (value) => {
    expect(() => parseDecimalOrThrow(value, 'listPrice')).toThrow(/listPrice must be a finite number/);
  });

  it.each(['', 'abc', '1,000', '1e3', ' 12', '12 ', '0x10', 'Infinity', 'NaN', '1.2.3', '-'])(
    'rejects the string %j',
    (value) => {
      expect(() => parseDecimalOrThrow(value)).toThrow(ComputationError);
    },
  );

  it('rejects a non-finite Decimal', () => {
    expect(() => parseDecimalOrThrow(new Decimal(NaN))).toThrow(/finite/);
  });

  it('accepts signs and bare fractions', () => {
    expect(parseDecimalOrThrow('-.5').toString()).toBe('-0.5');
    expect(parseDecimalOrThrow('+3.').toString()).toBe('3');
  });
});

describe('fixed', () => {
  it('rounds half away from zero and never prints a negative zero', () => {
    expect(fixed(parseDecimalOrThrow('2.0005'), 3)).toBe('2.001');
    expect(fixed(parseDecimalOrThrow('-2.0005'), 3)).toBe('-2.001');
    expect(fixed(parseDecimalOrThrow('-0.0004'), 3)).toBe('0.000');
  });
});
