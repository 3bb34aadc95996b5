import { createHash, randomBytes } from 'node:crypto';

/** 256 bits from the CSPRNG, URL-safe: used for refresh tokens and e-mailed links. */
export function newOpaqueToken(): string {
  return randomBytes(32).toString('base64url');
}

/** Only this digest is stored, so a database leak does not hand out live tokens. */
export function digestToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

export const REFRESH_COOKIE = 'hb_refresh';
export const REFRESH_COOKIE_PATH = '/api/auth';
/** A header a cross-site form or image cannot send: required on the cookie-bearing routes. */
export const CSRF_HEADER = 'x-requested-with';
export const CSRF_HEADER_VALUE = 'hitchbook';
