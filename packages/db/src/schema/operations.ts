import { pgTable, text } from 'drizzle-orm/pg-core';
import { id, timestamps } from './columns.js';

/** The account of one family outfit: every other row belongs to exactly one operation. */
export const operations = pgTable('operations', {
  id: id(),
  name: text().notNull(),
  address: text(),
  email: text(),
  phone: text(),
  ...timestamps,
});

export type Operation = typeof operations.$inferSelect;
export type NewOperation = typeof operations.$inferInsert;
