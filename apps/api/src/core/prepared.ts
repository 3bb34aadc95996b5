import { createHash } from 'node:crypto';

/**
 * The name a prepared statement goes by: the digest of its text, so the same text always gets the same
 * name on every connection and two different texts never share one. Each pooled connection parses and
 * plans a named statement once, and PostgreSQL moves to a cached generic plan after a few runs; for the
 * busiest lists, planning cost more than running them. Only for statements built from a bounded set of
 * shapes with placeholders for the values, since each connection keeps every statement it has prepared.
 */
export function statementName(text: string): string {
  return `hb_${createHash('sha1').update(text).digest('base64url')}`;
}
