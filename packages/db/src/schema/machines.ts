import { sql } from 'drizzle-orm';
import { check, date, foreignKey, index, integer, numeric, pgTable, text, timestamp, unique, uuid } from 'drizzle-orm/pg-core';
import { id, timestamps } from './columns.js';
import { operations } from './operations.js';
import { parties } from './parties.js';
import { uploads } from './uploads.js';
import { users } from './users.js';

/** A power unit, self-propelled machine or implement. Class ids are the engine's machine classes. */
export const machines = pgTable(
  'machines',
  {
    id: id(),
    operationId: uuid()
      .notNull()
      .references(() => operations.id, { onDelete: 'cascade' }),
    name: text().notNull(),
    classId: text().notNull(),
    kind: text({ enum: ['power', 'self-propelled', 'implement'] }).notNull(),
    make: text(),
    model: text(),
    year: integer(),
    serialNumber: text(),
    unitNumber: text(),
    ptoHp: numeric({ precision: 8, scale: 1 }),
    fuelType: text({ enum: ['diesel', 'gasoline', 'lpg'] }),
    widthFt: numeric({ precision: 8, scale: 2 }),
    listPrice: numeric({ precision: 14, scale: 2 }),
    purchasePrice: numeric({ precision: 14, scale: 2 }),
    purchaseDate: date({ mode: 'string' }),
    hoursAtPurchase: numeric({ precision: 12, scale: 1 }).notNull().default('0'),
    /** Planning figures for the published-method estimate. */
    plannedYearsOwned: integer(),
    plannedHoursPerYear: numeric({ precision: 10, scale: 1 }),
    /** Optional overrides of the class defaults. */
    speedMph: numeric({ precision: 6, scale: 2 }),
    fieldEfficiencyPct: numeric({ precision: 5, scale: 2 }),
    repairFactor1: numeric({ precision: 8, scale: 4 }),
    repairFactor2: numeric({ precision: 8, scale: 4 }),
    status: text({ enum: ['active', 'sold', 'retired'] }).notNull().default('active'),
    photoUploadId: uuid(),
    notes: text(),
    ...timestamps,
  },
  (t) => [
    unique('machines_operation_id_id_key').on(t.operationId, t.id),
    index('machines_operation_status_name_idx').on(t.operationId, t.status, t.name),
    foreignKey({ name: 'machines_photo_fk', columns: [t.operationId, t.photoUploadId], foreignColumns: [uploads.operationId, uploads.id] }).onDelete('no action'),
    check('machines_kind_check', sql`${t.kind} in ('power', 'self-propelled', 'implement')`),
    check('machines_status_check', sql`${t.status} in ('active', 'sold', 'retired')`),
    check('machines_fuel_check', sql`${t.fuelType} is null or ${t.fuelType} in ('diesel', 'gasoline', 'lpg')`),
    check('machines_prices_check', sql`coalesce(${t.listPrice}, 0) >= 0 and coalesce(${t.purchasePrice}, 0) >= 0`),
  ],
);

/**
 * Ownership shares, kept with their history: the set with the latest effective date on or before a day
 * is the ownership on that day. Each set sums to 100 (checked in the transaction that writes it).
 */
export const machineShares = pgTable(
  'machine_shares',
  {
    id: id(),
    operationId: uuid()
      .notNull()
      .references(() => operations.id, { onDelete: 'cascade' }),
    machineId: uuid().notNull(),
    partyId: uuid().notNull(),
    sharePct: numeric({ precision: 7, scale: 4 }).notNull(),
    effectiveFrom: date({ mode: 'string' }).notNull(),
    createdBy: uuid().references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    foreignKey({ name: 'machine_shares_machine_fk', columns: [t.operationId, t.machineId], foreignColumns: [machines.operationId, machines.id] }).onDelete('cascade'),
    foreignKey({ name: 'machine_shares_party_fk', columns: [t.operationId, t.partyId], foreignColumns: [parties.operationId, parties.id] }).onDelete('restrict'),
    unique('machine_shares_machine_date_party_key').on(t.machineId, t.effectiveFrom, t.partyId),
    check('machine_shares_pct_check', sql`${t.sharePct} > 0 and ${t.sharePct} <= 100`),
  ],
);

/** Hour-meter readings. A replaced meter is a 'reset' row: its offset is the old meter's last hours. */
export const meterReadings = pgTable(
  'meter_readings',
  {
    id: id(),
    operationId: uuid()
      .notNull()
      .references(() => operations.id, { onDelete: 'cascade' }),
    machineId: uuid().notNull(),
    readAt: timestamp({ withTimezone: true }).notNull(),
    hours: numeric({ precision: 12, scale: 1 }).notNull(),
    kind: text({ enum: ['reading', 'reset'] }).notNull().default('reading'),
    /** Hours the machine had before this meter started: total machine hours = offset + meter. */
    offsetHours: numeric({ precision: 12, scale: 1 }).notNull().default('0'),
    source: text({ enum: ['manual', 'work-entry', 'cost-entry', 'import'] }).notNull().default('manual'),
    workEntryId: uuid(),
    note: text(),
    createdBy: uuid().references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    foreignKey({ name: 'meter_readings_machine_fk', columns: [t.operationId, t.machineId], foreignColumns: [machines.operationId, machines.id] }).onDelete('cascade'),
    index('meter_readings_machine_read_at_idx').on(t.machineId, t.readAt),
    check('meter_readings_hours_check', sql`${t.hours} >= 0 and ${t.offsetHours} >= 0`),
    check('meter_readings_kind_check', sql`${t.kind} in ('reading', 'reset')`),
  ],
);

export const COST_CATEGORIES = ['fuel', 'repair', 'parts', 'tires', 'insurance', 'taxes', 'housing', 'interest', 'improvement'] as const;

/** Money spent on a machine, by whom; improvements are capital and are depreciated over their life. */
export const costEntries = pgTable(
  'cost_entries',
  {
    id: id(),
    operationId: uuid()
      .notNull()
      .references(() => operations.id, { onDelete: 'cascade' }),
    machineId: uuid().notNull(),
    category: text({ enum: COST_CATEGORIES }).notNull(),
    incurredOn: date({ mode: 'string' }).notNull(),
    amount: numeric({ precision: 14, scale: 2 }).notNull(),
    gallons: numeric({ precision: 12, scale: 3 }),
    meterHours: numeric({ precision: 12, scale: 1 }),
    vendor: text(),
    paidByPartyId: uuid(),
    improvementLifeYears: integer(),
    receiptUploadId: uuid(),
    notes: text(),
    /** For CSV imports of fuel tickets: the same row imported twice is the same cost. */
    importKey: text(),
    createdBy: uuid().references(() => users.id, { onDelete: 'set null' }),
    ...timestamps,
  },
  (t) => [
    foreignKey({ name: 'cost_entries_machine_fk', columns: [t.operationId, t.machineId], foreignColumns: [machines.operationId, machines.id] }).onDelete('restrict'),
    foreignKey({ name: 'cost_entries_paid_by_fk', columns: [t.operationId, t.paidByPartyId], foreignColumns: [parties.operationId, parties.id] }).onDelete('restrict'),
    foreignKey({ name: 'cost_entries_receipt_fk', columns: [t.operationId, t.receiptUploadId], foreignColumns: [uploads.operationId, uploads.id] }).onDelete('no action'),
    unique('cost_entries_operation_import_key').on(t.operationId, t.importKey),
    index('cost_entries_operation_machine_date_idx').on(t.operationId, t.machineId, t.incurredOn),
    index('cost_entries_operation_date_idx').on(t.operationId, t.incurredOn),
    // Improvements are spread over years of life, so a year's figures read earlier years' improvements; this keeps that read to improvements alone.
    index('cost_entries_operation_improvement_date_idx').on(t.operationId, t.incurredOn).where(sql`${t.category} = 'improvement'`),
    check('cost_entries_amount_check', sql`${t.amount} >= 0`),
    check('cost_entries_category_check', sql`${t.category} in ('fuel', 'repair', 'parts', 'tires', 'insurance', 'taxes', 'housing', 'interest', 'improvement')`),
    check('cost_entries_improvement_life_check', sql`${t.category} <> 'improvement' or coalesce(${t.improvementLifeYears}, 0) >= 1`),
  ],
);

export type Machine = typeof machines.$inferSelect;
export type NewMachine = typeof machines.$inferInsert;
export type MachineShare = typeof machineShares.$inferSelect;
export type MeterReading = typeof meterReadings.$inferSelect;
export type CostEntry = typeof costEntries.$inferSelect;
export type NewCostEntry = typeof costEntries.$inferInsert;
