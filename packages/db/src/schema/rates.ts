import { sql } from 'drizzle-orm';
import { check, date, foreignKey, index, integer, numeric, pgTable, text, timestamp, unique, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { id, timestamps } from './columns.js';
import { machines } from './machines.js';
import { operations } from './operations.js';
import { parties } from './parties.js';
import { workTypes } from './work.js';

/**
 * Prices for one relationship (family, neighbour, agency) from a date on; a sheet with a party is that
 * party's override. Invoices copy what they use, so editing a sheet never changes an issued invoice.
 */
export const rateSheets = pgTable(
  'rate_sheets',
  {
    id: id(),
    operationId: uuid()
      .notNull()
      .references(() => operations.id, { onDelete: 'cascade' }),
    name: text().notNull(),
    relationship: text({ enum: ['family', 'neighbour', 'agency'] }).notNull(),
    partyId: uuid(),
    effectiveFrom: date({ mode: 'string' }).notNull(),
    minimumCharge: numeric({ precision: 14, scale: 2 }).notNull().default('0'),
    minimumPer: text({ enum: ['entry', 'visit'] }).notNull().default('entry'),
    travelFlat: numeric({ precision: 14, scale: 2 }).notNull().default('0'),
    travelPerMile: numeric({ precision: 14, scale: 4 }).notNull().default('0'),
    fuelBasePrice: numeric({ precision: 14, scale: 4 }),
    fuelStep: numeric({ precision: 14, scale: 4 }),
    fuelAdjustPctPerStep: numeric({ precision: 7, scale: 4 }),
    operatorWage: numeric({ precision: 14, scale: 2 }).notNull().default('0'),
    laborFactor: numeric({ precision: 6, scale: 3 }).notNull().default('1.1'),
    termsDays: integer().notNull().default(30),
    notes: text(),
    archivedAt: timestamp({ withTimezone: true }),
    ...timestamps,
  },
  (t) => [
    unique('rate_sheets_operation_id_id_key').on(t.operationId, t.id),
    foreignKey({ name: 'rate_sheets_party_fk', columns: [t.operationId, t.partyId], foreignColumns: [parties.operationId, parties.id] }).onDelete('restrict'),
    index('rate_sheets_operation_relationship_from_idx').on(t.operationId, t.relationship, t.effectiveFrom),
    // Two live sheets starting the same day for the same relationship (or the same party) would leave the price ambiguous.
    uniqueIndex('rate_sheets_in_force_key')
      .on(t.operationId, t.relationship, sql`coalesce(${t.partyId}, '00000000-0000-0000-0000-000000000000'::uuid)`, t.effectiveFrom)
      .where(sql`${t.archivedAt} is null`),
    check('rate_sheets_relationship_check', sql`${t.relationship} in ('family', 'neighbour', 'agency')`),
    check('rate_sheets_money_check', sql`${t.minimumCharge} >= 0 and ${t.travelFlat} >= 0 and ${t.travelPerMile} >= 0 and ${t.operatorWage} >= 0`),
  ],
);

export const rateSheetLines = pgTable(
  'rate_sheet_lines',
  {
    id: id(),
    operationId: uuid().notNull(),
    rateSheetId: uuid().notNull(),
    workTypeId: uuid().notNull(),
    unit: text({ enum: ['acre', 'hour', 'mile', 'load', 'each'] }).notNull(),
    rate: numeric({ precision: 14, scale: 4 }).notNull(),
    /** 'custom': machine, tractor, fuel and operator; 'rental': the machine only. */
    chargeType: text({ enum: ['custom', 'rental'] }).notNull().default('custom'),
    minimumCharge: numeric({ precision: 14, scale: 2 }),
  },
  (t) => [
    foreignKey({ name: 'rate_sheet_lines_sheet_fk', columns: [t.operationId, t.rateSheetId], foreignColumns: [rateSheets.operationId, rateSheets.id] }).onDelete('cascade'),
    foreignKey({ name: 'rate_sheet_lines_work_type_fk', columns: [t.operationId, t.workTypeId], foreignColumns: [workTypes.operationId, workTypes.id] }).onDelete('restrict'),
    unique('rate_sheet_lines_sheet_type_unit_key').on(t.rateSheetId, t.workTypeId, t.unit, t.chargeType),
    check('rate_sheet_lines_rate_check', sql`${t.rate} >= 0`),
  ],
);

/** Machine-hour rates on a sheet: what a household is charged per hour for using another's machine. */
export const machineRates = pgTable(
  'machine_rates',
  {
    id: id(),
    operationId: uuid().notNull(),
    rateSheetId: uuid().notNull(),
    machineId: uuid().notNull(),
    ratePerHour: numeric({ precision: 14, scale: 4 }).notNull(),
  },
  (t) => [
    foreignKey({ name: 'machine_rates_sheet_fk', columns: [t.operationId, t.rateSheetId], foreignColumns: [rateSheets.operationId, rateSheets.id] }).onDelete('cascade'),
    foreignKey({ name: 'machine_rates_machine_fk', columns: [t.operationId, t.machineId], foreignColumns: [machines.operationId, machines.id] }).onDelete('cascade'),
    unique('machine_rates_sheet_machine_key').on(t.rateSheetId, t.machineId),
    check('machine_rates_rate_check', sql`${t.ratePerHour} >= 0`),
  ],
);

export type RateSheet = typeof rateSheets.$inferSelect;
export type NewRateSheet = typeof rateSheets.$inferInsert;
export type RateSheetLine = typeof rateSheetLines.$inferSelect;
export type MachineRate = typeof machineRates.$inferSelect;
