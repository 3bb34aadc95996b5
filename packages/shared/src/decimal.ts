import { Decimal } from 'decimal.js';
import { ComputationError } from './errors.js';

// A private constructor keeps the package independent of whatever global
// precision a consumer sets; 34 significant digits is IEEE decimal128, far
// beyond any farm amount and enough for fractional powers such as (h/1000)^1.3.
export const Dec = Decimal.clone({ precision: 34, rounding: Decimal.ROUND_HALF_UP });

export type DecimalInput = Decimal | string | number;

// Plain positional notation only: exponents, spaces, "Infinity" or hex are
// almost always a bug upstream, not a value a farmer typed.
const DECIMAL_STRING = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)$/;

export function isDecimalString(value: string): boolean {
  return DECIMAL_STRING.test(value);
}

export function parseDecimalOrThrow(value: DecimalInput, what = 'value'): Decimal {
  if (Decimal.isDecimal(value)) {
    if (!value.isFinite()) {
      throw new ComputationError('invalid-decimal', `${what} must be a finite number, got ${value.toString()}`);
    }
    return new Dec(value);
  }
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) {
      throw new ComputationError('invalid-decimal', `${what} must be a finite number, got ${String(value)}`);
    }
    return new Dec(value);
  }
  if (typeof value === 'string' && isDecimalString(value)) {
    return new Dec(value);
  }
  throw new ComputationError(
    'invalid-decimal',
    `${what} must be a decimal number such as "1234.50", got ${JSON.stringify(value)}`,
  );
}

export function fixed(value: Decimal, decimals: number): string {
  return value.toDecimalPlaces(decimals, Decimal.ROUND_HALF_UP).toFixed(decimals);
}
