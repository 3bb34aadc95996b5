import { Decimal } from 'decimal.js';
import { formatMoney } from '@hitchbook/shared/money';

export type DecimalLike = string | number | Decimal;

function groupThousands(digits: string): string {
  return digits.replace(/\B(?=(\d{3})+(?!\d))/g, ',');
}

/** Quantities (hours, acres, gallons) rounded half-up and printed with thousands separators. */
export function formatDecimal(value: DecimalLike, places: number): string {
  const fixed = new Decimal(value).toFixed(places, Decimal.ROUND_HALF_UP);
  const negative = fixed.startsWith('-') && /[1-9]/.test(fixed);
  const [whole = '0', fraction] = fixed.replace('-', '').split('.');
  const body = fraction === undefined ? groupThousands(whole) : `${groupThousands(whole)}.${fraction}`;
  return negative ? `-${body}` : body;
}

/** A money figure per unit, e.g. "$86.97/h" or "$4.02/acre". */
export function formatRate(value: DecimalLike, unit: string): string {
  return `${formatMoney(value)}/${unit}`;
}

/** Money per hour divided by work rate gives money per acre; null when no work rate is known. */
export function perAcre(perHour: DecimalLike, acresPerHour: DecimalLike): Decimal | null {
  const rate = new Decimal(acresPerHour);
  if (rate.lte(0)) return null;
  return new Decimal(perHour).div(rate).toDecimalPlaces(2, Decimal.ROUND_HALF_UP);
}
