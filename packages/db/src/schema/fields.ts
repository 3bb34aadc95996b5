import { sql } from 'drizzle-orm';
import { check, foreignKey, index, jsonb, numeric, pgTable, text, timestamp, unique, uuid } from 'drizzle-orm/pg-core';
import { id, timestamps } from './columns.js';
import { operations } from './operations.js';
import { parties } from './parties.js';

/** A field, or a road stretch (kind 'roadside') whose acres follow from its length and mowing width. */
export const fields = pgTable(
  'fields',
  {
    id: id(),
    operationId: uuid()
      .notNull()
      .references(() => operations.id, { onDelete: 'cascade' }),
    kind: text({ enum: ['field', 'roadside'] }).notNull().default('field'),
    name: text().notNull(),
    acres: numeric({ precision: 12, scale: 3 }).notNull(),
    ownerPartyId: uuid(),
    farmLabel: text(),
    notes: text(),
    boundary: jsonb(),
    boundaryAcres: numeric({ precision: 12, scale: 3 }),
    roadName: text(),
    roadFrom: text(),
    roadTo: text(),
    lengthMiles: numeric({ precision: 10, scale: 3 }),
    widthFt: numeric({ precision: 8, scale: 2 }),
    archivedAt: timestamp({ withTimezone: true }),
    ...timestamps,
  },
  (t) => [
    unique('fields_operation_id_id_key').on(t.operationId, t.id),
    index('fields_operation_kind_name_idx').on(t.operationId, t.kind, t.name),
    foreignKey({ name: 'fields_owner_party_fk', columns: [t.operationId, t.ownerPartyId], foreignColumns: [parties.operationId, parties.id] }).onDelete('restrict'),
    check('fields_kind_check', sql`${t.kind} in ('field', 'roadside')`),
    check('fields_acres_check', sql`${t.acres} >= 0`),
    check('fields_roadside_check', sql`${t.kind} <> 'roadside' or (${t.lengthMiles} > 0 and ${t.widthFt} > 0)`),
  ],
);

export type Field = typeof fields.$inferSelect;
export type NewField = typeof fields.$inferInsert;
