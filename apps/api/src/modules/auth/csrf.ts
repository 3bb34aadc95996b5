import type { Request } from 'express';
import { AppError } from '../../common/errors/app-error.js';
import { CSRF_HEADER, CSRF_HEADER_VALUE } from './tokens.js';

/**
 * The refresh cookie is SameSite=Strict; on top of that, the routes that read it demand a custom header
 * (which a cross-site form cannot send) and, when the browser names an Origin, one of ours.
 */
export function assertSameOriginRequest(req: Request, appUrl: string): void {
  if (req.headers[CSRF_HEADER] !== CSRF_HEADER_VALUE) {
    throw new AppError('forbidden', 'This request must come from the Hitchbook app.');
  }
  const origin = req.headers.origin;
  if (origin === undefined) return;
  const allowed = new Set([new URL(appUrl).origin, `${req.protocol}://${req.get('host') ?? ''}`]);
  if (!allowed.has(origin)) throw new AppError('forbidden', 'This request must come from the Hitchbook app.');
}
