import { Decimal } from 'decimal.js';

export type DecimalLike = string | number | Decimal;

function groupThousands(digits: string): string {
  return digits.replace(/\B(?=(\d{3})+(?!\d))/g, ',');
}

/** Rounds half-up like the server does for money, then prints with thousands separators. */
export function formatDecimal(value: DecimalLike, places: number): string {
  const fixed = new Decimal(value).toFixed(places, Decimal.ROUND_HALF_UP);
  const negative = fixed.startsWith('-') && /[1-9]/.test(fixed);
  const [whole = '0', fraction] = fixed.replace('-', '').split('.');
  const body = fraction === undefined ? groupThousands(whole) : `${groupThousands(whole)}.${fraction}`;
  return negative ? `-${body}` : body;
}

/** "$1,234.50"; negative amounts read "-$1,234.50". */
export function formatMoney(value: DecimalLike): string {
  const text = formatDecimal(value, 2);
  return text.startsWith('-') ? `-$${text.slice(1)}` : `$${text}`;
}

/** A money figure per unit, e.g. "$86.97/h" or "$4.02/acre". */
export function formatRate(value: DecimalLike, unit: string): string {
  return `${formatMoney(value)}/${unit}`;
}

export function formatPercent(value: DecimalLike, places = 1): string {
  return `${formatDecimal(value, places)} %`;
}

/** Money per hour divided by work rate gives money per acre; null when no work rate is known. */
export function perAcre(perHour: DecimalLike, acresPerHour: DecimalLike): Decimal | null {
  const rate = new Decimal(acresPerHour);
  if (rate.lte(0)) return null;
  return new Decimal(perHour).div(rate).toDecimalPlaces(2, Decimal.ROUND_HALF_UP);
}

/** True when the text is a plain decimal number (what the API accepts for money and quantities). */
export function isDecimalText(value: string): boolean {
  return /^-?\d+(\.\d+)?$/.test(value.trim());
}
