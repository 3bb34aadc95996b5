import { Decimal } from 'decimal.js';
import { Dec, fixed, parseDecimalOrThrow, type DecimalInput } from './decimal.js';
import { ComputationError } from './errors.js';

export type MoneyInput = DecimalInput;

export function parseMoneyOrThrow(value: MoneyInput, what = 'amount'): Decimal {
  return parseDecimalOrThrow(value, what);
}

export function addMoney(...amounts: MoneyInput[]): Decimal {
  return amounts.reduce<Decimal>((sum, amount) => sum.plus(parseMoneyOrThrow(amount)), new Dec(0));
}

export function multiplyMoney(amount: MoneyInput, factor: DecimalInput): Decimal {
  return parseMoneyOrThrow(amount).times(parseDecimalOrThrow(factor, 'factor'));
}

// Half-up in the commercial sense: halves move away from zero, so a refund
// rounds the same way as the charge it reverses.
export function roundToCent(amount: MoneyInput): Decimal {
  return parseMoneyOrThrow(amount).toDecimalPlaces(2, Decimal.ROUND_HALF_UP);
}

export function toMoneyString(amount: MoneyInput): string {
  return fixed(parseMoneyOrThrow(amount), 2);
}

export function formatMoney(amount: MoneyInput): string {
  const rounded = roundToCent(amount);
  const [whole = '0', cents = '00'] = rounded.abs().toFixed(2).split('.');
  const grouped = whole.replace(/\B(?=(\d{3})+(?!\d))/g, ',');
  return `${rounded.isNegative() && !rounded.isZero() ? '-' : ''}$${grouped}.${cents}`;
}

export function isWholeCents(amount: MoneyInput): boolean {
  return parseMoneyOrThrow(amount).times(100).isInteger();
}

// Stripe takes amounts as an integer number of the currency's minor unit.
export function toStripeCentsOrThrow(amount: MoneyInput): number {
  const cents = roundToCent(amount).times(100);
  const asNumber = cents.toNumber();
  if (!Number.isSafeInteger(asNumber)) {
    throw new ComputationError('unsafe-cents', `${cents.toFixed(0)} cents is beyond the safe integer range`);
  }
  return asNumber;
}

export function fromCents(cents: number | bigint): Decimal {
  if (typeof cents === 'number' && !Number.isSafeInteger(cents)) {
    throw new ComputationError('unsafe-cents', `cents must be a safe integer, got ${String(cents)}`);
  }
  return new Dec(cents.toString()).div(100);
}

export function toCentsOrThrow(amount: MoneyInput): bigint {
  const value = parseMoneyOrThrow(amount);
  if (!value.times(100).isInteger()) {
    throw new ComputationError('not-whole-cents', `${value.toString()} is not a whole number of cents`);
  }
  return BigInt(value.times(100).toFixed(0));
}

// Weights become integers over a common power of ten so that every share and
// remainder below is exact integer arithmetic, not a rounded division.
function weightsAsIntegersOrThrow(weights: DecimalInput[]): bigint[] {
  const parsed = weights.map((weight, index) => {
    const value = parseDecimalOrThrow(weight, `weight ${index}`);
    if (value.isNegative() && !value.isZero()) {
      throw new ComputationError('invalid-argument', `weight ${index} must not be negative`);
    }
    return value;
  });
  const scale = Math.max(0, ...parsed.map((value) => value.decimalPlaces()));
  return parsed.map((value) => BigInt(value.times(new Dec(10).pow(scale)).toFixed(0)));
}

// Largest-remainder allocation: every part is within one cent of its exact
// share and the parts always add up to the amount. Equal remainders go to the
// earlier part so the same input always gives the same split.
export function allocateOrThrow(amount: MoneyInput, weights: DecimalInput[]): Decimal[] {
  if (weights.length === 0) {
    throw new ComputationError('invalid-argument', 'allocation needs at least one weight');
  }
  const totalCents = toCentsOrThrow(amount);
  const integerWeights = weightsAsIntegersOrThrow(weights);
  const weightSum = integerWeights.reduce((sum, weight) => sum + weight, 0n);
  if (weightSum === 0n) {
    throw new ComputationError('invalid-argument', 'allocation weights must not all be zero');
  }
  const magnitude = totalCents < 0n ? -totalCents : totalCents;
  const parts = integerWeights.map((weight, index) => ({
    index,
    cents: (magnitude * weight) / weightSum,
    remainder: (magnitude * weight) % weightSum,
  }));
  let residual = magnitude - parts.reduce((sum, part) => sum + part.cents, 0n);
  const byRemainder = [...parts].sort((a, b) =>
    a.remainder === b.remainder ? a.index - b.index : a.remainder > b.remainder ? -1 : 1,
  );
  for (const part of byRemainder) {
    if (residual === 0n) break;
    part.cents += 1n;
    residual -= 1n;
  }
  const sign = totalCents < 0n ? -1n : 1n;
  return parts.map((part) => fromCents(sign * part.cents));
}
