/** Currencies whose amounts Stripe counts in whole units rather than hundredths (from Stripe's currency guide). */
const ZERO_DECIMAL = new Set(['bif', 'clp', 'djf', 'gnf', 'jpy', 'kmf', 'krw', 'mga', 'pyg', 'rwf', 'ugx', 'vnd', 'vuv', 'xaf', 'xof', 'xpf']);

/** Stripe's upper limit for one charge in a two-decimal currency, in minor units (999,999.99). */
export const MAX_AMOUNT = 99_999_999;

/** "1,240.50 USD" from 124050 and "usd", by string arithmetic so no float ever touches the amount. */
export function formatAmount(minorUnits: number, currency: string): string {
  const code = currency.toUpperCase();
  const digits = String(Math.abs(minorUnits));
  const sign = minorUnits < 0 ? '-' : '';
  if (ZERO_DECIMAL.has(currency.toLowerCase())) return `${sign}${groupThousands(digits)} ${code}`;
  const padded = digits.padStart(3, '0');
  return `${sign}${groupThousands(padded.slice(0, -2))}.${padded.slice(-2)} ${code}`;
}

function groupThousands(digits: string): string {
  return digits.replace(/\B(?=(\d{3})+(?!\d))/g, ',');
}
