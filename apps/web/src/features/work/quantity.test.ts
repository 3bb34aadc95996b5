import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { formatQuantity, isQuantity, meterHours, minutesAsHours, plainQuantity, typedHours } from './quantity';
import { formatDecimal } from '../../lib/money';

// decimal.js is the reference: the cab form must show exactly what the rest of the app (and the server) would.
const TYPED = ['0', '0.0', '7', '07.50', '61.200', '2.45', '2.449', '2.4449', '0.005', '0.015', '-0.004', '-2.5', '+3.25', '.5', '5.', '1204.55', '999999.995', '123456789.125', '12.3456'];

describe('quantities without decimal.js', () => {
  it('prints stored quantities as a person would type them', () => {
    for (const value of TYPED) expect(plainQuantity(value), value).toBe(new Decimal(value).toString());
    expect(plainQuantity('about 3')).toBe('about 3');
  });

  it('rounds half-up and groups thousands exactly as formatDecimal does', () => {
    for (const value of TYPED) for (const places of [0, 1, 2, 3]) expect(formatQuantity(value, places), `${value} to ${places}`).toBe(formatDecimal(value, places));
  });

  it('works out meter hours as end minus start', () => {
    const pairs: [string, string][] = [['1200.4', '1202.9'], ['1200', '1203.25'], ['15.05', '15.1'], ['99.95', '100'], ['100', '99.5'], ['0', '16.04'], ['0', '16']];
    for (const [start, end] of pairs) {
      const exact = new Decimal(end).minus(start);
      const result = meterHours(start, end, 1);
      expect(result.fixed, `${start}..${end}`).toBe(exact.toFixed(1));
      expect(result.negative).toBe(exact.lt(0));
      expect(result.over(16)).toBe(exact.gt(16));
    }
  });

  it('turns clock minutes into hours to the hundredth, halves up', () => {
    for (let minutes = 0; minutes <= 24 * 60; minutes += 1) {
      const exact = new Decimal(minutes).div(60);
      const result = minutesAsHours(minutes, 2);
      expect(result.fixed, `${minutes} min`).toBe(exact.toFixed(2));
      expect(result.over(16), `${minutes} min`).toBe(exact.gt(16));
    }
  });

  it('keeps typed hours as typed, to the hundredth', () => {
    for (const value of TYPED) {
      expect(typedHours(value, 2).fixed, value).toBe(new Decimal(value).toFixed(2));
      expect(typedHours(value, 2).over(16)).toBe(new Decimal(value).gt(16));
    }
    expect(typedHours('16.001', 2).over(16)).toBe(true);
  });

  it('accepts the same plain decimals as the shared schemas', () => {
    expect(['1', '1.5', '.5', '5.', '-1', '+1'].every(isQuantity)).toBe(true);
    expect(['', '1e3', '1,5', ' 1', 'Infinity', '0x10', '1.2.3'].some(isQuantity)).toBe(false);
  });
});
