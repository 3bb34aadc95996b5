/** The PostgreSQL error under Drizzle's wrapper, when there is one. */
export interface PgError {
  code: string;
  constraint?: string;
  detail?: string;
}

export function pgErrorOf(err: unknown): PgError | null {
  let e: unknown = err;
  for (let depth = 0; e && depth < 5; depth++) {
    const code = (e as { code?: unknown }).code;
    if (typeof code === 'string' && /^[0-9A-Z]{5}$/.test(code)) return e as PgError;
    e = (e as { cause?: unknown }).cause;
  }
  return null;
}

export const UNIQUE_VIOLATION = '23505';
export const FOREIGN_KEY_VIOLATION = '23503';
export const CHECK_VIOLATION = '23514';
export const SERIALIZATION_FAILURE = '40001';
export const DEADLOCK_DETECTED = '40P01';
