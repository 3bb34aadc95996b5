import { z } from 'zod';
import { uuidSchema } from './common.js';
import { isoDateSchema } from './work-entries.js';

/** The kinds of record the audit log names, in the order the filter offers them. */
export const AUDIT_ENTITY_TYPES = [
  'work-entry',
  'rate-sheet',
  'invoice',
  'machine',
  'cost-entry',
  'square-up',
  'square-up-transfer',
  'membership',
  'user',
  'party',
  'field',
  'work-type',
  'upload',
] as const;
export type AuditEntityType = (typeof AUDIT_ENTITY_TYPES)[number];

export const auditListQuerySchema = z
  .strictObject({
    page: z.coerce.number().int().min(1).max(100000).default(1),
    pageSize: z.coerce.number().int().min(1).max(200).default(50),
    entityType: z.enum(AUDIT_ENTITY_TYPES, { message: 'Pick one of the listed kinds of record.' }).optional(),
    entityId: z.string().trim().min(1).max(64).optional(),
    actorUserId: uuidSchema.optional(),
    /** Calendar days in UTC, both included. */
    from: isoDateSchema.optional(),
    to: isoDateSchema.optional(),
  })
  .refine((q) => !q.from || !q.to || q.from <= q.to, { path: ['to'], message: 'The end date is before the start date.' });
export type AuditListQuery = z.output<typeof auditListQuerySchema>;

/** One field that a change set, cleared or altered, with short text forms of both values. */
export interface AuditChangeDto {
  field: string;
  before: string | null;
  after: string | null;
}

export interface AuditEntryDto {
  id: string;
  at: string;
  actor: { userId: string; name: string; email: string } | null;
  action: string;
  entityType: string;
  entityId: string | null;
  changes: AuditChangeDto[];
}
