import { sql } from 'drizzle-orm';
import { check, date, foreignKey, index, integer, jsonb, numeric, pgTable, text, timestamp, unique, uuid } from 'drizzle-orm/pg-core';
import { id, timestamps } from './columns.js';
import { operations } from './operations.js';
import { parties } from './parties.js';
import { users } from './users.js';

/** A period's statement between households; closing it freezes the statement so later edits cannot change it. */
export const squareUps = pgTable(
  'square_ups',
  {
    id: id(),
    operationId: uuid()
      .notNull()
      .references(() => operations.id, { onDelete: 'cascade' }),
    name: text().notNull(),
    periodFrom: date({ mode: 'string' }).notNull(),
    periodTo: date({ mode: 'string' }).notNull(),
    status: text({ enum: ['open', 'closed'] }).notNull().default('open'),
    /**
     * 'ownership': fixed costs by share, operating costs by use. 'use': every cost by use, for owners who
     * agreed to settle a jointly owned machine by use because their use differs from their shares.
     */
    fixedCostsBy: text({ enum: ['ownership', 'use'] }).notNull().default('ownership'),
    closedAt: timestamp({ withTimezone: true }),
    closedBy: uuid().references(() => users.id, { onDelete: 'set null' }),
    /** The statement as computed when the period was closed. */
    statement: jsonb(),
    createdBy: uuid().references(() => users.id, { onDelete: 'set null' }),
    ...timestamps,
  },
  (t) => [
    unique('square_ups_operation_id_id_key').on(t.operationId, t.id),
    index('square_ups_operation_period_idx').on(t.operationId, t.periodFrom),
    check('square_ups_period_check', sql`${t.periodTo} >= ${t.periodFrom}`),
    check('square_ups_status_check', sql`${t.status} in ('open', 'closed')`),
    check('square_ups_fixed_costs_by_check', sql`${t.fixedCostsBy} in ('ownership', 'use')`),
  ],
);

export const squareUpTransfers = pgTable(
  'square_up_transfers',
  {
    id: id(),
    operationId: uuid().notNull(),
    squareUpId: uuid().notNull(),
    /** Order of the transfer in the frozen statement. */
    position: integer().notNull(),
    fromPartyId: uuid().notNull(),
    toPartyId: uuid().notNull(),
    amount: numeric({ precision: 14, scale: 2 }).notNull(),
    paidOn: date({ mode: 'string' }),
    method: text({ enum: ['cheque', 'cash', 'transfer'] }),
    reference: text(),
    recordedBy: uuid().references(() => users.id, { onDelete: 'set null' }),
    recordedAt: timestamp({ withTimezone: true }),
  },
  (t) => [
    foreignKey({ name: 'square_up_transfers_square_up_fk', columns: [t.operationId, t.squareUpId], foreignColumns: [squareUps.operationId, squareUps.id] }).onDelete('cascade'),
    foreignKey({ name: 'square_up_transfers_from_fk', columns: [t.operationId, t.fromPartyId], foreignColumns: [parties.operationId, parties.id] }).onDelete('restrict'),
    foreignKey({ name: 'square_up_transfers_to_fk', columns: [t.operationId, t.toPartyId], foreignColumns: [parties.operationId, parties.id] }).onDelete('restrict'),
    unique('square_up_transfers_square_up_position_key').on(t.squareUpId, t.position),
    check('square_up_transfers_amount_check', sql`${t.amount} > 0`),
    check('square_up_transfers_parties_check', sql`${t.fromPartyId} <> ${t.toPartyId}`),
  ],
);

/** The response of a write that carried an Idempotency-Key, so a retry gets the same answer. */
export const idempotencyKeys = pgTable(
  'idempotency_keys',
  {
    operationId: uuid()
      .notNull()
      .references(() => operations.id, { onDelete: 'cascade' }),
    key: text().notNull(),
    route: text().notNull(),
    requestHash: text().notNull(),
    statusCode: integer(),
    response: jsonb(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [unique('idempotency_keys_operation_key_key').on(t.operationId, t.key)],
);

export type SquareUp = typeof squareUps.$inferSelect;
export type SquareUpTransfer = typeof squareUpTransfers.$inferSelect;
