import type { Request } from 'express';

/** The access token of an `Authorization: Bearer …` header, or null when the request carries none. */
export function bearerTokenOf(req: Request): string | null {
  const header = req.headers.authorization;
  return header?.startsWith('Bearer ') ? header.slice('Bearer '.length).trim() : null;
}
