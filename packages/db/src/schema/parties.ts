import { sql } from 'drizzle-orm';
import { check, index, pgTable, text, timestamp, unique, uuid } from 'drizzle-orm/pg-core';
import { id, timestamps } from './columns.js';
import { operations } from './operations.js';

/** Households inside the operation and customers billed by it. */
export const parties = pgTable(
  'parties',
  {
    id: id(),
    operationId: uuid()
      .notNull()
      .references(() => operations.id, { onDelete: 'cascade' }),
    kind: text({ enum: ['household', 'customer'] }).notNull(),
    name: text().notNull(),
    relationship: text({ enum: ['family', 'neighbour', 'agency'] }).notNull(),
    email: text(),
    phone: text(),
    address: text(),
    notes: text(),
    archivedAt: timestamp({ withTimezone: true }),
    ...timestamps,
  },
  (t) => [
    // Lets child tables reference (operation_id, party_id) so a row can never point into another operation.
    unique('parties_operation_id_id_key').on(t.operationId, t.id),
    index('parties_operation_kind_name_idx').on(t.operationId, t.kind, t.name),
    check('parties_kind_check', sql`${t.kind} in ('household', 'customer')`),
    check('parties_relationship_check', sql`${t.relationship} in ('family', 'neighbour', 'agency')`),
  ],
);

export type Party = typeof parties.$inferSelect;
export type NewParty = typeof parties.$inferInsert;
