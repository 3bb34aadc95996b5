// Exact arithmetic for the few quantities the cab form works out while it is being filled in (meter hours,
// clock hours, the readout), on integers scaled by a power of ten: decimal.js would add a sixth to what the
// form loads before it shows. quantity.test.ts checks every function against decimal.js. Quantities here are
// what a person types or the server stores (numeric(12,3)), never money.

/** Plain positional decimals only, as the shared schemas accept them (shared/decimal's isDecimalString). */
const DECIMAL_STRING = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)$/;

export function isQuantity(value: string): boolean {
  return DECIMAL_STRING.test(value);
}

/** units / 10^scale */
interface Scaled {
  units: bigint;
  scale: number;
}

function parse(value: string): Scaled {
  const negative = value.startsWith('-');
  const [whole = '', fraction = ''] = value.replace(/^[+-]/, '').split('.');
  const units = BigInt(`${whole || '0'}${fraction}`);
  return { units: negative ? -units : units, scale: fraction.length };
}

function rescale(q: Scaled, scale: number): bigint {
  return q.units * 10n ** BigInt(scale - q.scale);
}

function difference(end: Scaled, start: Scaled): Scaled {
  const scale = Math.max(end.scale, start.scale);
  return { units: rescale(end, scale) - rescale(start, scale), scale };
}

/** Rounded half away from zero to `places`, as decimal.js's toFixed with ROUND_HALF_UP. */
function toFixed(q: Scaled, places: number): string {
  const negative = q.units < 0n;
  let magnitude = negative ? -q.units : q.units;
  if (places >= q.scale) magnitude *= 10n ** BigInt(places - q.scale);
  else {
    const divisor = 10n ** BigInt(q.scale - places);
    const remainder = magnitude % divisor;
    magnitude = magnitude / divisor + (remainder * 2n >= divisor ? 1n : 0n);
  }
  const digits = magnitude.toString().padStart(places + 1, '0');
  const whole = digits.slice(0, digits.length - places);
  const body = places > 0 ? `${whole}.${digits.slice(digits.length - places)}` : whole;
  return negative ? `-${body}` : body;
}

function exceeds(q: Scaled, limit: number): boolean {
  return q.units > BigInt(limit) * 10n ** BigInt(q.scale);
}

function groupThousands(digits: string): string {
  return digits.replace(/\B(?=(\d{3})+(?!\d))/g, ',');
}

/** A stored quantity ("61.200") as a person would type it ("61.2"). */
export function plainQuantity(value: string): string {
  if (!isQuantity(value)) return value;
  const negative = value.startsWith('-');
  const [whole = '', fraction = ''] = value.replace(/^[+-]/, '').split('.');
  const w = whole.replace(/^0+(?=\d)/, '') || '0';
  const f = fraction.replace(/0+$/, '');
  const body = f ? `${w}.${f}` : w;
  return negative && /[1-9]/.test(body) ? `-${body}` : body;
}

/** Quantities rounded half-up and printed with thousands separators, e.g. "1,204.5". */
export function formatQuantity(value: string, places: number): string {
  const fixed = toFixed(parse(value), places);
  const negative = fixed.startsWith('-') && /[1-9]/.test(fixed);
  const [whole = '0', fraction] = fixed.replace('-', '').split('.');
  const body = fraction === undefined ? groupThousands(whole) : `${groupThousands(whole)}.${fraction}`;
  return negative ? `-${body}` : body;
}

export interface Hours {
  /** Rounded to the places asked for. */
  fixed: string;
  negative: boolean;
  /** More than `limit` hours before rounding. */
  over: (limit: number) => boolean;
}

function hours(q: Scaled, places: number): Hours {
  return { fixed: toFixed(q, places), negative: q.units < 0n, over: (limit) => exceeds(q, limit) };
}

/** A meter's end minus its start. */
export function meterHours(start: string, end: string, places: number): Hours {
  return hours(difference(parse(end), parse(start)), places);
}

/** Typed hours as they are. */
export function typedHours(value: string, places: number): Hours {
  return hours(parse(value), places);
}

/** Whole minutes as hours, rounded half-up to `places` (exact: the minutes are scaled before dividing by 60). */
export function minutesAsHours(minutes: number, places: number): Hours {
  const scale = places + 1;
  const scaled = BigInt(minutes) * 10n ** BigInt(scale);
  const units = scaled / 60n;
  // One guard digit, and whether anything is left below it, decide the rounding exactly.
  const exact = scaled % 60n === 0n;
  const q: Scaled = { units: exact ? units : units * 10n + 1n, scale: exact ? scale : scale + 1 };
  return hours(q, places);
}
