export type ErrorCode =
  | 'validation'
  | 'unauthenticated'
  | 'forbidden'
  | 'not-found'
  | 'conflict'
  | 'too-large'
  | 'throttled'
  | 'unavailable';

export interface FieldIssue {
  path: string;
  message: string;
}

/** A failure the caller can act on; mapped to an HTTP status in one place (the exception filter). */
export class AppError extends Error {
  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly issues: FieldIssue[] = [],
    readonly retryAfterSeconds?: number,
  ) {
    super(message);
  }
}

export const notFound = (what = 'Not found.') => new AppError('not-found', what);
export const forbidden = (why = 'Your role may not do this.') => new AppError('forbidden', why);
export const conflict = (why: string) => new AppError('conflict', why);
export const unauthenticated = (why = 'Sign in first.') => new AppError('unauthenticated', why);
export const invalid = (path: string, message: string) => new AppError('validation', 'Some fields need attention.', [{ path, message }]);

export function statusOf(code: ErrorCode): number {
  switch (code) {
    case 'validation':
      return 400;
    case 'unauthenticated':
      return 401;
    case 'forbidden':
      return 403;
    case 'not-found':
      return 404;
    case 'conflict':
      return 409;
    case 'too-large':
      return 413;
    case 'throttled':
      return 429;
    case 'unavailable':
      return 503;
  }
}
