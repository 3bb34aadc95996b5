import { index, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { id } from './columns.js';
import { operations } from './operations.js';
import { users } from './users.js';

/** Who changed what, when: rows are only ever inserted. */
export const auditLog = pgTable(
  'audit_log',
  {
    id: id(),
    operationId: uuid().references(() => operations.id, { onDelete: 'cascade' }),
    actorUserId: uuid().references(() => users.id, { onDelete: 'set null' }),
    action: text().notNull(),
    entityType: text().notNull(),
    entityId: text(),
    before: jsonb(),
    after: jsonb(),
    requestId: text(),
    ip: text(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    index('audit_log_operation_created_idx').on(t.operationId, t.createdAt),
    index('audit_log_entity_idx').on(t.entityType, t.entityId),
  ],
);

export type AuditEntry = typeof auditLog.$inferSelect;
export type NewAuditEntry = typeof auditLog.$inferInsert;
