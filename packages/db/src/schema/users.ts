import { sql } from 'drizzle-orm';
import { check, foreignKey, index, pgTable, text, timestamp, unique, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { id, timestamps } from './columns.js';
import { operations } from './operations.js';
import { parties } from './parties.js';

export const users = pgTable(
  'users',
  {
    id: id(),
    email: text().notNull(),
    name: text().notNull(),
    /** Null until an invited person sets a password. */
    passwordHash: text(),
    passwordChangedAt: timestamp({ withTimezone: true }),
    disabledAt: timestamp({ withTimezone: true }),
    ...timestamps,
  },
  (t) => [uniqueIndex('users_email_lower_idx').on(sql`lower(${t.email})`)],
);

/** A user's role in one operation; a customer member is tied to one customer party. */
export const memberships = pgTable(
  'memberships',
  {
    id: id(),
    operationId: uuid()
      .notNull()
      .references(() => operations.id, { onDelete: 'cascade' }),
    userId: uuid()
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    role: text({ enum: ['owner', 'partner', 'operator', 'bookkeeper', 'customer'] }).notNull(),
    partyId: uuid(),
    status: text({ enum: ['active', 'invited'] }).notNull().default('active'),
    ...timestamps,
  },
  (t) => [
    unique('memberships_operation_user_key').on(t.operationId, t.userId),
    index('memberships_user_idx').on(t.userId),
    foreignKey({
      name: 'memberships_party_fk',
      columns: [t.operationId, t.partyId],
      foreignColumns: [parties.operationId, parties.id],
    }).onDelete('restrict'),
    check('memberships_role_check', sql`${t.role} in ('owner', 'partner', 'operator', 'bookkeeper', 'customer')`),
    check('memberships_customer_party_check', sql`${t.role} <> 'customer' or ${t.partyId} is not null`),
    check('memberships_status_check', sql`${t.status} in ('active', 'invited')`),
  ],
);

export type User = typeof users.$inferSelect;
export type NewUser = typeof users.$inferInsert;
export type Membership = typeof memberships.$inferSelect;
export type NewMembership = typeof memberships.$inferInsert;
