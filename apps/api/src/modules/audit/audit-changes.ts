import type { AuditChangeDto } from '@hitchbook/shared/schemas/audit';

/** Bookkeeping columns every row carries; a change to them says nothing a reader needs. */
const NOISE = new Set(['id', 'operationId', 'version', 'createdAt', 'updatedAt', 'clientId']);
/** Never shown, whatever a recorder put in the row. */
const SECRET = /password|token|secret|hash/i;
const MAX_TEXT = 80;
const MAX_CHANGES = 24;

function asRecord(value: unknown): Record<string, unknown> {
  if (value === null || value === undefined) return {};
  if (typeof value === 'object' && !Array.isArray(value)) return value as Record<string, unknown>;
  return { value };
}

function text(value: unknown): string | null {
  if (value === null || value === undefined) return null;
  const s = typeof value === 'string' ? value : JSON.stringify(value);
  return s.length > MAX_TEXT ? `${s.slice(0, MAX_TEXT - 1)}…` : s;
}

/**
 * The fields an audited change touched, before and after, as short text: what the audit screen shows.
 * A creation lists what was set, a removal what was there; fields that did not change are left out.
 */
export function summariseChange(before: unknown, after: unknown): AuditChangeDto[] {
  const b = asRecord(before);
  const a = asRecord(after);
  const fields = [...new Set([...Object.keys(b), ...Object.keys(a)])].filter((f) => !NOISE.has(f) && !SECRET.test(f));
  const changes: AuditChangeDto[] = [];
  for (const field of fields) {
    const was = text(b[field]);
    const now = text(a[field]);
    if (was === now) continue;
    changes.push({ field, before: was, after: now });
    if (changes.length === MAX_CHANGES) break;
  }
  return changes;
}
