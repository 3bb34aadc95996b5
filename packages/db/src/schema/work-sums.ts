import { sql } from 'drizzle-orm';
import { check, date, foreignKey, index, integer, numeric, pgTable, primaryKey, uuid } from 'drizzle-orm/pg-core';
import { machines } from './machines.js';
import { operations } from './operations.js';

// Sums of work entries kept beside them, so a year's reports read a few thousand summed rows instead of
// every entry of the year. Triggers on work_entries, fields and parties keep them exact in the writing
// transaction (migration 0009); nothing in the application writes them. A row exists only while it sums
// at least one entry.

/**
 * Machine use a square-up counts, by household and month: work billed to a household (approved or
 * squared) is that household's; work billed outside the households counts for the household owning the
 * field (approved, invoiced or squared). One row per machine of the entry (power unit and implement).
 */
export const machineHouseholdMonths = pgTable(
  'machine_household_months',
  {
    operationId: uuid()
      .notNull()
      .references(() => operations.id, { onDelete: 'cascade' }),
    /** The first day of the month. */
    month: date({ mode: 'string' }).notNull(),
    machineId: uuid().notNull(),
    householdId: uuid().notNull(),
    entries: integer().notNull(),
    hours: numeric({ precision: 14, scale: 2 }).notNull(),
  },
  (t) => [
    primaryKey({ name: 'machine_household_months_pkey', columns: [t.operationId, t.month, t.machineId, t.householdId] }),
    foreignKey({ name: 'machine_household_months_machine_fk', columns: [t.operationId, t.machineId], foreignColumns: [machines.operationId, machines.id] }).onDelete('cascade'),
    check('machine_household_months_month_check', sql`extract(day from ${t.month}) = 1`),
    // Rows a write has just emptied, found and removed without reading the others.
    index('machine_household_months_emptied_idx').on(t.operationId).where(sql`${t.entries} = 0`),
  ],
);

/** Settled work (approved, invoiced, squared) by machine, work type and calendar year: the machine-rate report's hours and acres. */
export const machineWorkTypeYears = pgTable(
  'machine_work_type_years',
  {
    operationId: uuid()
      .notNull()
      .references(() => operations.id, { onDelete: 'cascade' }),
    year: integer().notNull(),
    machineId: uuid().notNull(),
    workTypeId: uuid().notNull(),
    entries: integer().notNull(),
    hours: numeric({ precision: 14, scale: 2 }).notNull(),
    /** Entries without acres count as none. */
    acres: numeric({ precision: 16, scale: 3 }).notNull(),
  },
  (t) => [
    primaryKey({ name: 'machine_work_type_years_pkey', columns: [t.operationId, t.year, t.machineId, t.workTypeId] }),
    foreignKey({ name: 'machine_work_type_years_machine_fk', columns: [t.operationId, t.machineId], foreignColumns: [machines.operationId, machines.id] }).onDelete('cascade'),
    index('machine_work_type_years_emptied_idx').on(t.operationId).where(sql`${t.entries} = 0`),
  ],
);

export type MachineHouseholdMonth = typeof machineHouseholdMonths.$inferSelect;
export type MachineWorkTypeYear = typeof machineWorkTypeYears.$inferSelect;
