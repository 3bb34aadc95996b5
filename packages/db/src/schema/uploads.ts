import { bigint, index, pgTable, text, timestamp, unique, uuid } from 'drizzle-orm/pg-core';
import { id } from './columns.js';
import { operations } from './operations.js';
import { users } from './users.js';

/** A stored file: kept on disk outside any served folder under a random key; this row says what it is. */
export const uploads = pgTable(
  'uploads',
  {
    id: id(),
    operationId: uuid()
      .notNull()
      .references(() => operations.id, { onDelete: 'cascade' }),
    purpose: text({ enum: ['receipt', 'machine-photo', 'entry-photo', 'field-boundary', 'import'] }).notNull(),
    originalName: text().notNull(),
    contentType: text().notNull(),
    sizeBytes: bigint({ mode: 'number' }).notNull(),
    storageKey: text().notNull().unique('uploads_storage_key_key'),
    sha256: text().notNull(),
    createdBy: uuid().references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [unique('uploads_operation_id_id_key').on(t.operationId, t.id), index('uploads_operation_purpose_idx').on(t.operationId, t.purpose)],
);

export type Upload = typeof uploads.$inferSelect;
export type NewUpload = typeof uploads.$inferInsert;
