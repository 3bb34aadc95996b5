import { Decimal } from 'decimal.js';
import { formatDecimal } from '../../lib/money';

/**
 * A rate as the sheet stores it (up to four places), shown with at least cents but never
 * rounded: $0.6525/mile must not read as $0.65/mile.
 */
export function formatUnitRate(rate: string, unit: string): string {
  const places = Math.max(2, new Decimal(rate).decimalPlaces());
  return `$${formatDecimal(rate, places)}/${unit}`;
}
