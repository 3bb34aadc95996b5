import { randomBytes } from 'node:crypto';

const ALPHABET = '0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz';

/** Random letters and digits, like the tail of a Stripe id. */
export function randomToken(length: number): string {
  const bytes = randomBytes(length);
  let out = '';
  // 248 is the largest multiple of 62 below 256, so every letter is equally likely.
  for (const byte of bytes) if (byte < 248) out += ALPHABET[byte % 62];
  return out.length >= length ? out.slice(0, length) : out + randomToken(length - out.length);
}

/** Ids with Stripe's prefixes: cs_test_ for test-mode Checkout Sessions, pi_, ch_, re_, evt_, pm_, req_ for the rest. */
export function newId(prefix: 'cs_test' | 'pi' | 'ch' | 're' | 'evt' | 'pm' | 'req' | 'li' | 'price' | 'prod'): string {
  return `${prefix}_${randomToken(prefix === 'cs_test' ? 58 : 24)}`;
}

export function unixNow(): number {
  return Math.floor(Date.now() / 1000);
}
