import type { Decimal } from 'decimal.js';
import { z } from 'zod';
import { timestampSchema, uuidSchema } from './common.js';
import type { WorkEntryWarning } from '../work-entry-checks.js';
import { decimalInput, type DecimalRules } from './decimal-input.js';

export const WORK_ENTRY_STATES = ['draft', 'submitted', 'approved', 'invoiced', 'squared'] as const;
export type WorkEntryState = (typeof WORK_ENTRY_STATES)[number];

/** The states a caller may ask for when logging: approval is a separate step by an owner or partner. */
export const LOGGABLE_STATES = ['draft', 'submitted'] as const;

/** More than a whole day in one entry is a typing error, never a long shift. */
export const MAX_ENTRY_HOURS = 24;

const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;

/** A calendar date as YYYY-MM-DD; 2000 to 2100 covers every record a family outfit keeps. */
export const isoDateSchema = z
  .string({ error: 'Enter a date as YYYY-MM-DD.' })
  .refine(isCalendarDate, { message: 'Enter a real date as YYYY-MM-DD between 2000 and 2100.' });

export function isCalendarDate(value: string): boolean {
  const m = ISO_DATE.exec(value);
  if (!m) return false;
  const [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
  if (y < 2000 || y > 2100) return false;
  const date = new Date(Date.UTC(y, mo - 1, d));
  return date.getUTCFullYear() === y && date.getUTCMonth() === mo - 1 && date.getUTCDate() === d;
}

const entryTimestampSchema = timestampSchema('Enter a date and time with its offset, for example 2025-06-03T07:30:00-05:00.');

/** A decimal that also fits its database column's scale (meters read to a tenth, acres to a thousandth). */
function quantity(rules: DecimalRules, decimals: number) {
  return decimalInput(rules).refine((value: Decimal) => value.decimalPlaces() <= decimals, {
    message: decimals === 0 ? 'Must be a whole number' : `At most ${decimals} decimal place${decimals > 1 ? 's' : ''}`,
  });
}

export const meterInput = () => quantity({ atLeast: 0, atMost: 1_000_000 }, 1);
export const hoursInput = () => quantity({ atLeast: 0, atMost: MAX_ENTRY_HOURS }, 2);

const notesSchema = z
  .string()
  .trim()
  .max(2000, { message: 'At most 2000 characters.' })
  .nullish()
  .transform((s) => (s ? s : null));

// Every field a work entry carries. Nullable ones can be cleared on an update.
const entryFields = {
  workDate: isoDateSchema,
  /** Defaults to the caller; an operator may only log as themselves. */
  operatorUserId: uuidSchema.optional(),
  fieldId: uuidSchema,
  workTypeId: uuidSchema,
  powerMachineId: uuidSchema.nullish(),
  implementMachineId: uuidSchema.nullish(),
  /** Hour meter of the power unit; the start defaults to the machine's last reading. */
  meterStart: meterInput().nullish(),
  meterEnd: meterInput().nullish(),
  startedAt: entryTimestampSchema.nullish(),
  endedAt: entryTimestampSchema.nullish(),
  /** Machine hours; when left out they come from meter end − start, else from the clock times. */
  hours: hoursInput().nullish(),
  /** Defaults to the machine hours. */
  operatorHours: hoursInput().nullish(),
  /** Defaults to the field's acres (a road stretch's strip acres). */
  acres: quantity({ atLeast: 0, atMost: 100_000 }, 3).nullish(),
  /** Defaults to a road stretch's length. */
  miles: quantity({ atLeast: 0, atMost: 10_000 }, 3).nullish(),
  loads: quantity({ atLeast: 0, atMost: 100_000 }, 2).nullish(),
  eachCount: quantity({ atLeast: 0, atMost: 100_000 }, 2).nullish(),
  fuelGallons: quantity({ atLeast: 0, atMost: 10_000 }, 3).nullish(),
  billToPartyId: uuidSchema,
  notes: notesSchema,
};

interface EntryShape {
  meterStart?: Decimal | null;
  meterEnd?: Decimal | null;
  startedAt?: string | null;
  endedAt?: string | null;
  powerMachineId?: string | null;
}

/** Rules between fields that hold whenever both sides are present in the same body. */
function checkEntryConsistency(v: EntryShape, ctx: z.RefinementCtx): void {
  if (v.meterStart && v.meterEnd) {
    if (v.meterEnd.lt(v.meterStart)) {
      ctx.addIssue({ code: 'custom', path: ['meterEnd'], message: `Meter end ${v.meterEnd.toFixed()} is below meter start ${v.meterStart.toFixed()}.` });
    } else if (v.meterEnd.minus(v.meterStart).gt(MAX_ENTRY_HOURS)) {
      ctx.addIssue({ code: 'custom', path: ['meterEnd'], message: `Meter end is more than ${MAX_ENTRY_HOURS} hours after meter start; split the work into daily entries.` });
    }
  }
  if (v.startedAt && v.endedAt) {
    const span = Date.parse(v.endedAt) - Date.parse(v.startedAt);
    if (span < 0) ctx.addIssue({ code: 'custom', path: ['endedAt'], message: 'The end time is before the start time.' });
    else if (span > MAX_ENTRY_HOURS * 3_600_000) {
      ctx.addIssue({ code: 'custom', path: ['endedAt'], message: `More than ${MAX_ENTRY_HOURS} hours between start and end; split the work into daily entries.` });
    }
  }
  if ((v.meterStart || v.meterEnd) && v.powerMachineId === null) {
    ctx.addIssue({ code: 'custom', path: ['powerMachineId'], message: 'Meter readings belong to a power unit; pick the one you read.' });
  }
}

export const workEntryCreateSchema = z
  .strictObject({
    /** Chosen by the cab app before the first send: resending the same entry returns the one already stored. */
    clientId: uuidSchema.optional(),
    ...entryFields,
    state: z.enum(LOGGABLE_STATES, { message: 'draft or submitted.' }).default('draft'),
  })
  .superRefine((v, ctx) => {
    checkEntryConsistency(v, ctx);
    if (v.meterStart && !v.meterEnd) ctx.addIssue({ code: 'custom', path: ['meterEnd'], message: 'Give the meter end too, or leave the meter out.' });
    const hasHours = v.hours != null || v.meterEnd != null || (v.startedAt != null && v.endedAt != null);
    if (!hasHours) {
      ctx.addIssue({ code: 'custom', path: ['hours'], message: 'Give the hours, the meter end (and start), or the start and end times.' });
    }
    if (v.meterEnd && !v.powerMachineId) {
      ctx.addIssue({ code: 'custom', path: ['powerMachineId'], message: 'Meter readings belong to a power unit; pick the one you read.' });
    }
  });
export type WorkEntryCreateInput = z.infer<typeof workEntryCreateSchema>;

export const workEntryUpdateSchema = z
  .strictObject(entryFields)
  .partial()
  .extend({
    /** The version the change was made against: a stale one is refused (409), not silently overwritten. */
    version: z.number({ error: 'Send the version you edited.' }).int().min(1),
  })
  .superRefine((v, ctx) => checkEntryConsistency(v, ctx));
export type WorkEntryUpdateInput = z.infer<typeof workEntryUpdateSchema>;

/** Body of submit, approve and reopen: the version is optional, checked when sent. */
export const workEntryTransitionSchema = z.strictObject({
  version: z.number().int().min(1).optional(),
});
export type WorkEntryTransitionInput = z.infer<typeof workEntryTransitionSchema>;

export const WORK_ENTRY_SORTS = ['date', 'hours', 'acres', 'field', 'machine', 'operator', 'state'] as const;
const sortValues = WORK_ENTRY_SORTS.flatMap((s) => [s, `-${s}`]) as [string, ...string[]];

/** One or several states, comma-separated in the query (`state=submitted,approved`). */
const stateListSchema = z
  .string()
  .max(100)
  .transform((s) => s.split(',').map((p) => p.trim()).filter(Boolean))
  .pipe(z.array(z.enum(WORK_ENTRY_STATES, { message: `One or more of: ${WORK_ENTRY_STATES.join(', ')}.` })).min(1));

const filterShape = {
  dateFrom: isoDateSchema.optional(),
  dateTo: isoDateSchema.optional(),
  /** Matches the power unit or the implement. */
  machineId: uuidSchema.optional(),
  fieldId: uuidSchema.optional(),
  operatorUserId: uuidSchema.optional(),
  billToPartyId: uuidSchema.optional(),
  workTypeId: uuidSchema.optional(),
  state: stateListSchema.optional(),
  sort: z.enum(sortValues, { message: `One of: ${sortValues.join(', ')}.` }).default('-date'),
};
const datesInOrder = (v: { dateFrom?: string; dateTo?: string }) => !v.dateFrom || !v.dateTo || v.dateFrom <= v.dateTo;
const datesInOrderIssue = { path: ['dateTo'], message: 'The end date is before the start date.' };

/** Filters of the table and of the CSV export. */
export const workEntryFilterSchema = z.strictObject(filterShape).refine(datesInOrder, datesInOrderIssue);

export const workEntryListQuerySchema = z
  .strictObject({
    ...filterShape,
    page: z.coerce.number().int().min(1).max(100000).default(1),
    pageSize: z.coerce.number().int().min(1).max(200).default(25),
  })
  .refine(datesInOrder, datesInOrderIssue);
export type WorkEntryFilter = z.infer<typeof workEntryFilterSchema>;
export type WorkEntryListQuery = z.infer<typeof workEntryListQuerySchema>;

export const IMPORT_KINDS = ['entries', 'fuel'] as const;
export const IMPORT_MODES = ['preview', 'commit'] as const;
export const workEntryImportQuerySchema = z.strictObject({
  kind: z.enum(IMPORT_KINDS, { message: 'entries or fuel.' }),
  mode: z.enum(IMPORT_MODES, { message: 'preview or commit.' }).default('preview'),
});
export type ImportKind = (typeof IMPORT_KINDS)[number];

/** The largest CSV the import accepts; a bigger upload is refused before it is read. */
export const IMPORT_MAX_BYTES = 10 * 1024 * 1024;
export const IMPORT_MAX_ROWS = 20_000;

export interface ImportColumn {
  /** The header as written in the file; matched ignoring case, spaces, dashes and underscores. */
  header: string;
  required: boolean;
  description: string;
}

/** Columns of a work-entry CSV, in the order the template lists them. */
export const WORK_ENTRY_IMPORT_COLUMNS = [
  { header: 'date', required: true, description: 'Day of the work, YYYY-MM-DD or M/D/YYYY.' },
  { header: 'field', required: true, description: "Name of one of the operation's fields or road stretches." },
  { header: 'work type', required: true, description: 'Name or key of a work type, for example "Disking".' },
  { header: 'power unit', required: false, description: 'Name or unit number of the tractor or self-propelled machine.' },
  { header: 'implement', required: false, description: 'Name or unit number of the implement.' },
  { header: 'operator email', required: true, description: 'E-mail of the member who ran the machine.' },
  { header: 'hours', required: false, description: 'Machine hours; leave blank to take them from meter end − start.' },
  { header: 'meter start', required: false, description: 'Hour meter at the start (tenths).' },
  { header: 'meter end', required: false, description: 'Hour meter at the end (tenths).' },
  { header: 'operator hours', required: false, description: 'Operator hours; blank means the same as the machine hours.' },
  { header: 'acres', required: false, description: "Acres done; blank means the field's acres." },
  { header: 'miles', required: false, description: "Miles done; blank means a road stretch's length." },
  { header: 'loads', required: false, description: 'Loads hauled.' },
  { header: 'fuel gallons', required: false, description: 'Fuel added during the work.' },
  { header: 'bill to', required: true, description: 'Name of the household or customer billed.' },
  { header: 'notes', required: false, description: 'Free text.' },
] as const satisfies readonly ImportColumn[];

/** Columns of a fuel-ticket CSV; each row becomes a fuel cost entry on the machine. */
export const FUEL_TICKET_IMPORT_COLUMNS = [
  { header: 'date', required: true, description: 'Day on the ticket, YYYY-MM-DD or M/D/YYYY.' },
  { header: 'machine', required: true, description: 'Name or unit number of the machine fuelled.' },
  { header: 'gallons', required: true, description: 'Gallons delivered.' },
  { header: 'amount', required: true, description: 'Amount paid in dollars and cents, for example 312.40.' },
  { header: 'vendor', required: false, description: 'Who sold the fuel.' },
  { header: 'paid by', required: false, description: 'Name of the household that paid.' },
  { header: 'meter hours', required: false, description: 'Hour meter when fuelled (tenths).' },
  { header: 'notes', required: false, description: 'Free text.' },
] as const satisfies readonly ImportColumn[];

// ---- Response shapes (what the API sends; the web types its queries with these) ----

export type { WorkEntryWarning };

export interface WorkEntryDto {
  id: string;
  clientId: string | null;
  workDate: string;
  operatorUserId: string;
  operatorName: string;
  fieldId: string;
  fieldName: string;
  workTypeId: string;
  workTypeName: string;
  powerMachineId: string | null;
  powerMachineName: string | null;
  implementMachineId: string | null;
  implementMachineName: string | null;
  meterStart: string | null;
  meterEnd: string | null;
  startedAt: string | null;
  endedAt: string | null;
  hours: string;
  operatorHours: string | null;
  acres: string | null;
  miles: string | null;
  loads: string | null;
  eachCount: string | null;
  fuelGallons: string | null;
  billToPartyId: string;
  billToName: string;
  notes: string | null;
  state: WorkEntryState;
  submittedAt: string | null;
  approvedAt: string | null;
  version: number;
  createdAt: string;
  updatedAt: string;
}

export interface WorkEntryWithWarnings extends WorkEntryDto {
  warnings: WorkEntryWarning[];
}

export interface WorkEntryPage {
  items: WorkEntryDto[];
  total: number;
  page: number;
  pageSize: number;
  /** Sums over every entry the filters match, not just this page. */
  totals: { hours: string; acres: string; miles: string };
}

export interface ImportRowError {
  /** The spreadsheet row: the header is row 1, the first data row is row 2. */
  row: number;
  column: string;
  reason: string;
}

export interface ImportReport<Row = Record<string, unknown>> {
  kind: ImportKind;
  mode: 'preview' | 'commit';
  /** Data rows in the file. */
  total: number;
  /** Rows without errors, new or already imported. */
  valid: number;
  invalid: number;
  /** Rows already imported earlier (or repeated in this file): never stored twice. */
  skipped: number;
  /** Rows written by this request (always 0 for a preview). */
  created: number;
  errors: ImportRowError[];
  skippedRows: { row: number; reason: string }[];
  /** What a commit creates (preview) or created (commit), each with its spreadsheet row. */
  rows: Array<{ row: number } & Row>;
}

// ---------------------------------------------------------------- photos of an entry

export { MAX_ENTRY_PHOTOS } from '../upload-limits.js';

/** A photo attached to an entry, as listed beside it (the file itself comes from its own route). */
export interface WorkEntryPhotoDto {
  uploadId: string;
  originalName: string;
  contentType: string;
  sizeBytes: number;
  createdAt: string;
}
