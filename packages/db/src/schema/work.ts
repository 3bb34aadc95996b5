import { sql } from 'drizzle-orm';
import { boolean, check, date, foreignKey, index, integer, numeric, pgTable, primaryKey, text, timestamp, unique, uuid } from 'drizzle-orm/pg-core';
import { id, timestamps } from './columns.js';
import { fields } from './fields.js';
import { machines } from './machines.js';
import { operations } from './operations.js';
import { parties } from './parties.js';
import { uploads } from './uploads.js';
import { users } from './users.js';

export const WORK_UNITS = ['acre', 'hour', 'mile', 'load', 'each'] as const;
export const WORK_ENTRY_STATES = ['draft', 'submitted', 'approved', 'invoiced', 'squared'] as const;

/** Kinds of work with their default billing unit and the cautions shown when they are picked. */
export const workTypes = pgTable(
  'work_types',
  {
    id: id(),
    operationId: uuid()
      .notNull()
      .references(() => operations.id, { onDelete: 'cascade' }),
    key: text().notNull(),
    name: text().notNull(),
    defaultUnit: text({ enum: WORK_UNITS }).notNull(),
    /** Keys of the product's caution texts: 'roadside', 'anhydrous', 'pto', 'chemical'. */
    cautions: text().array().notNull().default(sql`'{}'::text[]`),
    /** The implement class usually used, for field-capacity plausibility checks. */
    typicalClassId: text(),
    archived: boolean().notNull().default(false),
    ...timestamps,
  },
  (t) => [
    unique('work_types_operation_id_id_key').on(t.operationId, t.id),
    unique('work_types_operation_key_key').on(t.operationId, t.key),
    check('work_types_unit_check', sql`${t.defaultUnit} in ('acre', 'hour', 'mile', 'load', 'each')`),
  ],
);

/** One pass of work: machine time and operator time on a field or road stretch, billed to a party. */
export const workEntries = pgTable(
  'work_entries',
  {
    id: id(),
    operationId: uuid()
      .notNull()
      .references(() => operations.id, { onDelete: 'cascade' }),
    workDate: date({ mode: 'string' }).notNull(),
    operatorUserId: uuid()
      .notNull()
      .references(() => users.id, { onDelete: 'restrict' }),
    fieldId: uuid().notNull(),
    powerMachineId: uuid(),
    implementMachineId: uuid(),
    workTypeId: uuid().notNull(),
    meterStart: numeric({ precision: 12, scale: 1 }),
    meterEnd: numeric({ precision: 12, scale: 1 }),
    startedAt: timestamp({ withTimezone: true }),
    endedAt: timestamp({ withTimezone: true }),
    /** Machine hours, from the meter or the clock. */
    hours: numeric({ precision: 8, scale: 2 }).notNull(),
    operatorHours: numeric({ precision: 8, scale: 2 }),
    acres: numeric({ precision: 12, scale: 3 }),
    miles: numeric({ precision: 10, scale: 3 }),
    loads: numeric({ precision: 10, scale: 2 }),
    eachCount: numeric({ precision: 10, scale: 2 }),
    fuelGallons: numeric({ precision: 10, scale: 3 }),
    billToPartyId: uuid().notNull(),
    notes: text(),
    state: text({ enum: WORK_ENTRY_STATES }).notNull().default('draft'),
    submittedAt: timestamp({ withTimezone: true }),
    approvedAt: timestamp({ withTimezone: true }),
    approvedBy: uuid().references(() => users.id, { onDelete: 'set null' }),
    /** Set by the cab app: a resend of the same entry is recognised, never stored twice. */
    clientId: uuid(),
    /** Set by CSV import: a re-upload of the same row is recognised, never stored twice. */
    importKey: text(),
    version: integer().notNull().default(1),
    createdBy: uuid().references(() => users.id, { onDelete: 'set null' }),
    ...timestamps,
  },
  (t) => [
    unique('work_entries_operation_id_id_key').on(t.operationId, t.id),
    unique('work_entries_operation_client_id_key').on(t.operationId, t.clientId),
    unique('work_entries_operation_import_key').on(t.operationId, t.importKey),
    foreignKey({ name: 'work_entries_field_fk', columns: [t.operationId, t.fieldId], foreignColumns: [fields.operationId, fields.id] }).onDelete('restrict'),
    foreignKey({ name: 'work_entries_power_fk', columns: [t.operationId, t.powerMachineId], foreignColumns: [machines.operationId, machines.id] }).onDelete('restrict'),
    foreignKey({ name: 'work_entries_implement_fk', columns: [t.operationId, t.implementMachineId], foreignColumns: [machines.operationId, machines.id] }).onDelete('restrict'),
    foreignKey({ name: 'work_entries_work_type_fk', columns: [t.operationId, t.workTypeId], foreignColumns: [workTypes.operationId, workTypes.id] }).onDelete('restrict'),
    foreignKey({ name: 'work_entries_bill_to_fk', columns: [t.operationId, t.billToPartyId], foreignColumns: [parties.operationId, parties.id] }).onDelete('restrict'),
    index('work_entries_operation_date_idx').on(t.operationId, t.workDate),
    index('work_entries_operation_state_date_idx').on(t.operationId, t.state, t.workDate),
    index('work_entries_operation_bill_to_state_idx').on(t.operationId, t.billToPartyId, t.state, t.workDate),
    index('work_entries_operation_field_date_idx').on(t.operationId, t.fieldId, t.workDate),
    // A machine's entries in the table's default order: a page of them is read off the index, not sorted.
    // The trailing columns (after the unique id, so they do not change the order) let the totals and the
    // power-or-implement split be answered from the index alone.
    index('work_entries_operation_power_recent_idx').on(
      t.operationId,
      t.powerMachineId,
      t.workDate.desc().nullsLast(),
      t.startedAt.desc().nullsLast(),
      t.createdAt.desc().nullsLast(),
      t.id,
      t.implementMachineId,
      t.hours,
      t.acres,
      t.miles,
    ),
    index('work_entries_operation_implement_recent_idx').on(
      t.operationId,
      t.implementMachineId,
      t.workDate.desc().nullsLast(),
      t.startedAt.desc().nullsLast(),
      t.createdAt.desc().nullsLast(),
      t.id,
      t.powerMachineId,
      t.hours,
      t.acres,
      t.miles,
    ),
    index('work_entries_operation_operator_date_idx').on(t.operationId, t.operatorUserId, t.workDate),
    index('work_entries_operation_work_type_date_idx').on(t.operationId, t.workTypeId, t.workDate),
    // The table's default order (newest first, the same tie-breaks): a page is read off the index, not sorted.
    index('work_entries_operation_recent_idx').on(t.operationId, t.workDate.desc().nullsLast(), t.startedAt.desc().nullsLast(), t.createdAt.desc().nullsLast(), t.id),
    check('work_entries_state_check', sql`${t.state} in ('draft', 'submitted', 'approved', 'invoiced', 'squared')`),
    check('work_entries_hours_check', sql`${t.hours} >= 0 and ${t.hours} <= 24`),
    check('work_entries_meter_order_check', sql`${t.meterStart} is null or ${t.meterEnd} is null or ${t.meterEnd} >= ${t.meterStart}`),
    check('work_entries_clock_order_check', sql`${t.startedAt} is null or ${t.endedAt} is null or ${t.endedAt} >= ${t.startedAt}`),
    check(
      'work_entries_quantities_check',
      sql`coalesce(${t.acres}, 0) >= 0 and coalesce(${t.miles}, 0) >= 0 and coalesce(${t.loads}, 0) >= 0 and coalesce(${t.eachCount}, 0) >= 0 and coalesce(${t.fuelGallons}, 0) >= 0`,
    ),
  ],
);

export const workEntryPhotos = pgTable(
  'work_entry_photos',
  {
    operationId: uuid().notNull(),
    workEntryId: uuid().notNull(),
    uploadId: uuid().notNull(),
  },
  (t) => [
    primaryKey({ name: 'work_entry_photos_pkey', columns: [t.workEntryId, t.uploadId] }),
    foreignKey({ name: 'work_entry_photos_entry_fk', columns: [t.operationId, t.workEntryId], foreignColumns: [workEntries.operationId, workEntries.id] }).onDelete('cascade'),
    foreignKey({ name: 'work_entry_photos_upload_fk', columns: [t.operationId, t.uploadId], foreignColumns: [uploads.operationId, uploads.id] }).onDelete('cascade'),
  ],
);

export type WorkType = typeof workTypes.$inferSelect;
export type NewWorkType = typeof workTypes.$inferInsert;
export type WorkEntry = typeof workEntries.$inferSelect;
export type NewWorkEntry = typeof workEntries.$inferInsert;
