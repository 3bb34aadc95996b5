import type { Decimal } from 'decimal.js';
import { z } from 'zod';
import { COST_CATEGORIES, type CostCategory } from '../actual-rate.js';
import { Dec } from '../decimal.js';
import { MACHINE_CLASS_IDS, machineClassOrThrow, type MachineClassId, type MachineKind } from '../machine-classes.js';
import type { FuelType } from '../machine-cost.js';
import { singleLineText, timestampSchema, uuidSchema } from './common.js';
import { decimalInput, wholeNumberInput, type DecimalRules } from './decimal-input.js';

export const MACHINE_STATUSES = ['active', 'sold', 'retired'] as const;
export type MachineStatus = (typeof MACHINE_STATUSES)[number];
export const FUEL_TYPES = ['diesel', 'gasoline', 'lpg'] as const satisfies readonly FuelType[];
export const MACHINE_KINDS = ['power', 'self-propelled', 'implement'] as const satisfies readonly MachineKind[];
export const METER_READING_KINDS = ['reading', 'reset'] as const;
export type MeterReadingKind = (typeof METER_READING_KINDS)[number];

/** Ownership shares of one machine always add up to exactly this. */
export const FULL_OWNERSHIP_PCT = 100;

function oneOf<const T extends readonly [string, ...string[]]>(values: T) {
  return z.enum(values, { error: (issue) => (issue.input === undefined ? 'Required' : `Use one of: ${values.join(', ')}`) });
}

/** A decimal that also fits its column's scale, so the database never rounds what was entered. */
export function scaledDecimal(rules: DecimalRules, decimals: number) {
  return decimalInput(rules).refine((value: Decimal) => value.decimalPlaces() <= decimals, {
    message: decimals === 0 ? 'Must be a whole number' : `At most ${decimals} decimal place${decimals > 1 ? 's' : ''}`,
  });
}

const moneyInput = (atMost: number) => decimalInput({ atLeast: 0, atMost, wholeCents: true });

const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;

function isCalendarDate(value: string): boolean {
  const m = ISO_DATE.exec(value);
  if (!m) return false;
  const [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
  const date = new Date(Date.UTC(y, mo - 1, d));
  return y >= 1900 && y <= 2100 && date.getUTCFullYear() === y && date.getUTCMonth() === mo - 1 && date.getUTCDate() === d;
}

/** A calendar day as YYYY-MM-DD; machines bought decades ago still need their purchase date. */
export const calendarDateSchema = z
  .string({ error: 'Enter a date as YYYY-MM-DD' })
  .refine(isCalendarDate, { message: 'Enter a real date as YYYY-MM-DD between 1900 and 2100' });

/** Optional single-line text: an empty string clears it, a missing key leaves it alone. */
export const optionalLine = (max: number) =>
  z
    .string()
    .trim()
    .max(max, { message: `At most ${max} characters` })
    .refine((s) => !/[\r\n\u0000]/.test(s), { message: 'Must be a single line' })
    .nullish()
    .transform((s) => (s === undefined ? undefined : s || null));

export const optionalNotes = (max = 2000) =>
  z
    .string()
    .trim()
    .max(max, { message: `At most ${max} characters` })
    .refine((s) => !s.includes('\u0000'), { message: 'Contains a NUL character' })
    .nullish()
    .transform((s) => (s === undefined ? undefined : s || null));

/** Free-text search of a list; a NUL byte could never match and PostgreSQL refuses it in text. */
export const searchQuery = z
  .string()
  .trim()
  .max(200, { message: 'At most 200 characters' })
  .refine((s) => !s.includes('\u0000'), { message: 'Contains a NUL character' })
  .optional();

const pageFields = {
  page: z.coerce.number().int().min(1).max(100000).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(25),
};

// ---------------------------------------------------------------- machines

const machineFields = {
  name: singleLineText(120),
  classId: oneOf(MACHINE_CLASS_IDS),
  make: optionalLine(80),
  model: optionalLine(80),
  year: wholeNumberInput({ atLeast: 1900, atMost: 2100 }).nullish(),
  serialNumber: optionalLine(80),
  unitNumber: optionalLine(40),
  ptoHp: scaledDecimal({ above: 0, atMost: 2000 }, 1).nullish(),
  fuelType: oneOf(FUEL_TYPES).nullish(),
  /** Working width of an implement or header, for field capacity. */
  widthFt: scaledDecimal({ above: 0, atMost: 200 }, 2).nullish(),
  listPrice: moneyInput(100_000_000).nullish(),
  purchasePrice: moneyInput(100_000_000).nullish(),
  purchaseDate: calendarDateSchema.nullish(),
  hoursAtPurchase: scaledDecimal({ atLeast: 0, atMost: 1_000_000 }, 1).optional(),
  /** Planning figures for the published-method estimate; class defaults fill what is left empty. */
  plannedYearsOwned: wholeNumberInput({ atLeast: 1, atMost: 50 }).nullish(),
  plannedHoursPerYear: scaledDecimal({ above: 0, atMost: 8760 }, 1).nullish(),
  /** Overrides of the class's typical field speed, efficiency and repair factors. */
  speedMph: scaledDecimal({ above: 0, atMost: 50 }, 2).nullish(),
  fieldEfficiencyPct: scaledDecimal({ above: 0, atMost: 100 }, 2).nullish(),
  repairFactor1: scaledDecimal({ above: 0, atMost: 10 }, 4).nullish(),
  repairFactor2: scaledDecimal({ above: 0, atMost: 10 }, 4).nullish(),
  status: oneOf(MACHINE_STATUSES).optional(),
  photoUploadId: uuidSchema.nullish(),
  notes: optionalNotes(),
};

export interface MachineRuleSubject {
  classId: string;
  ptoHp?: unknown;
  fuelType?: unknown;
}

export interface RuleIssue {
  path: string;
  message: string;
}

const isEmpty = (value: unknown) => value === undefined || value === null;

/**
 * Rules that follow from the class: a power unit needs its PTO horsepower (fuel use and the
 * tractor's remaining-value band both come from it); an implement has no engine of its own.
 * The API runs these again on the merged row of an update.
 */
export function machineRuleIssues(machine: MachineRuleSubject): RuleIssue[] {
  const machineClass = machineClassOrThrow(machine.classId);
  const issues: RuleIssue[] = [];
  if (machineClass.kind === 'power' && isEmpty(machine.ptoHp)) {
    issues.push({ path: 'ptoHp', message: `Required for a ${machineClass.label.toLowerCase()}` });
  }
  if (machineClass.kind === 'implement') {
    if (!isEmpty(machine.ptoHp)) issues.push({ path: 'ptoHp', message: 'An implement has no engine: give the PTO hp on the tractor' });
    if (!isEmpty(machine.fuelType)) issues.push({ path: 'fuelType', message: 'An implement has no engine: leave the fuel type empty' });
  }
  return issues;
}

/**
 * Lets a cross-field rule run even when another field already failed, as long as the field the rule
 * hinges on is valid: the caller then sees every problem at once instead of one round at a time.
 */
export function whenValid(key: string, values: readonly string[]) {
  return {
    when: (payload: { value: unknown }) => {
      const value = payload.value as Record<string, unknown> | null;
      return typeof value === 'object' && value !== null && values.includes(value[key] as string);
    },
  };
}

function addRuleIssues(issues: RuleIssue[], ctx: z.RefinementCtx) {
  for (const issue of issues) ctx.addIssue({ code: 'custom', path: issue.path.split('.'), message: issue.message });
}

export const shareLineSchema = z.strictObject({
  partyId: uuidSchema,
  sharePct: scaledDecimal({ above: 0, atMost: FULL_OWNERSHIP_PCT }, 4),
});

function sharesTotal(lines: readonly { sharePct: Decimal }[]): Decimal {
  return lines.reduce<Decimal>((sum, line) => sum.plus(line.sharePct), new Dec(0));
}

/** One share per household; together exactly 100 %. */
const shareLinesSchema = z
  .array(shareLineSchema)
  .min(1, 'Name at least one owning household')
  .max(20, 'At most 20 owners')
  .superRefine((lines, ctx) => {
    const seen = new Set<string>();
    lines.forEach((line, index) => {
      if (seen.has(line.partyId)) ctx.addIssue({ code: 'custom', path: [index, 'partyId'], message: 'This household is named twice' });
      seen.add(line.partyId);
    });
    const total = sharesTotal(lines);
    if (!total.eq(FULL_OWNERSHIP_PCT)) {
      ctx.addIssue({ code: 'custom', message: `Shares must add up to exactly 100 %; these add up to ${total.toString()} %` });
    }
  });

export const machineCreateSchema = z
  .strictObject({
    ...machineFields,
    /** Owners from the purchase date (or today). A partner who leaves this out owns the new machine outright. */
    owners: shareLinesSchema.optional(),
  })
  .superRefine((machine, ctx) => addRuleIssues(machineRuleIssues(machine), ctx), whenValid('classId', MACHINE_CLASS_IDS));
export type MachineCreateInput = z.input<typeof machineCreateSchema>;
export type MachineCreate = z.output<typeof machineCreateSchema>;

export const machineUpdateSchema = z
  .strictObject(machineFields)
  .partial()
  .refine((patch) => Object.keys(patch).length > 0, { message: 'Nothing to change' });
export type MachineUpdateInput = z.input<typeof machineUpdateSchema>;
export type MachineUpdate = z.output<typeof machineUpdateSchema>;

export const MACHINE_SORTS = ['name', '-name', 'year', '-year', 'classId', '-classId', 'status', '-status', 'createdAt', '-createdAt'] as const;

export const machineListQuerySchema = z.strictObject({
  ...pageFields,
  sort: oneOf(MACHINE_SORTS).default('name'),
  q: searchQuery,
  status: oneOf(MACHINE_STATUSES).optional(),
  kind: oneOf(MACHINE_KINDS).optional(),
  classId: oneOf(MACHINE_CLASS_IDS).optional(),
  /** Machines this household holds a share of today. */
  ownerPartyId: uuidSchema.optional(),
});
export type MachineListQuery = z.output<typeof machineListQuerySchema>;

// ---------------------------------------------------------------- shares

export const machineSharesPutSchema = z.strictObject({
  effectiveFrom: calendarDateSchema,
  shares: shareLinesSchema,
});
export type MachineSharesPutInput = z.input<typeof machineSharesPutSchema>;
export type MachineSharesPut = z.output<typeof machineSharesPutSchema>;

export const machineSharesQuerySchema = z.strictObject({
  /** The set in force on this day (default today). */
  on: calendarDateSchema.optional(),
});

// ---------------------------------------------------------------- meter readings

/** A clock skew allowance: a reading taken "now" on a phone a little ahead still counts as now. */
export const METER_FUTURE_TOLERANCE_MS = 5 * 60 * 1000;

export const meterReadingCreateSchema = z
  .strictObject({
    /** When the meter was read; defaults to now. */
    readAt: timestampSchema('Enter a date and time with its offset, for example 2025-06-03T07:30:00-05:00')
      .refine((s) => Date.parse(s) <= Date.now() + METER_FUTURE_TOLERANCE_MS, { message: 'A meter cannot be read in the future' })
      .optional(),
    hours: scaledDecimal({ atLeast: 0, atMost: 1_000_000 }, 1),
    kind: oneOf(METER_READING_KINDS).default('reading'),
    /** For a reset: the machine's total hours when the new meter went in (defaults to the last total). */
    offsetHours: scaledDecimal({ atLeast: 0, atMost: 1_000_000 }, 1).optional(),
    note: optionalNotes(500),
  })
  .superRefine((reading, ctx) => {
    if (reading.kind === 'reading' && reading.offsetHours !== undefined) {
      ctx.addIssue({ code: 'custom', path: ['offsetHours'], message: 'Only a reset (a replaced meter) has an offset' });
    }
  });
export type MeterReadingCreateInput = z.input<typeof meterReadingCreateSchema>;
export type MeterReadingCreate = z.output<typeof meterReadingCreateSchema>;

export const meterReadingListQuerySchema = z.strictObject({
  ...pageFields,
  pageSize: z.coerce.number().int().min(1).max(1000).default(100),
});

// ---------------------------------------------------------------- cost entries

const costFields = {
  category: oneOf(COST_CATEGORIES),
  incurredOn: calendarDateSchema,
  amount: moneyInput(10_000_000),
  /** Fuel only. */
  gallons: scaledDecimal({ above: 0, atMost: 100_000 }, 3).nullish(),
  /** The hour meter when the money was spent (a repair at 4,210 h). */
  meterHours: scaledDecimal({ atLeast: 0, atMost: 1_000_000 }, 1).nullish(),
  vendor: optionalLine(120),
  /** The household that paid. */
  paidByPartyId: uuidSchema,
  /** Improvements only: the years the outlay is written off over. */
  improvementLifeYears: wholeNumberInput({ atLeast: 1, atMost: 50 }).nullish(),
  receiptUploadId: uuidSchema.nullish(),
  notes: optionalNotes(),
};

export interface CostRuleSubject {
  category: CostCategory;
  gallons?: unknown;
  improvementLifeYears?: unknown;
}

/** Improvements are capital and need a life to spread over; gallons belong on fuel tickets. */
export function costEntryRuleIssues(entry: CostRuleSubject): RuleIssue[] {
  const issues: RuleIssue[] = [];
  if (entry.category === 'improvement' && isEmpty(entry.improvementLifeYears)) {
    issues.push({ path: 'improvementLifeYears', message: 'Required for an improvement: the years it is written off over' });
  }
  if (entry.category !== 'improvement' && !isEmpty(entry.improvementLifeYears)) {
    issues.push({ path: 'improvementLifeYears', message: 'Only an improvement has a life in years' });
  }
  if (entry.category !== 'fuel' && !isEmpty(entry.gallons)) {
    issues.push({ path: 'gallons', message: 'Gallons belong on fuel entries only' });
  }
  return issues;
}

export const costEntryCreateSchema = z
  .strictObject(costFields)
  .superRefine((entry, ctx) => addRuleIssues(costEntryRuleIssues(entry), ctx), whenValid('category', COST_CATEGORIES));
export type CostEntryCreateInput = z.input<typeof costEntryCreateSchema>;
export type CostEntryCreate = z.output<typeof costEntryCreateSchema>;

export const costEntryUpdateSchema = z
  .strictObject(costFields)
  .partial()
  .refine((patch) => Object.keys(patch).length > 0, { message: 'Nothing to change' });
export type CostEntryUpdateInput = z.input<typeof costEntryUpdateSchema>;
export type CostEntryUpdate = z.output<typeof costEntryUpdateSchema>;

export const COST_SORTS = ['incurredOn', '-incurredOn', 'amount', '-amount', 'category', '-category'] as const;

export const costEntryListQuerySchema = z
  .strictObject({
    ...pageFields,
    sort: oneOf(COST_SORTS).default('-incurredOn'),
    category: oneOf(COST_CATEGORIES).optional(),
    from: calendarDateSchema.optional(),
    to: calendarDateSchema.optional(),
    paidByPartyId: uuidSchema.optional(),
  })
  .refine((q) => !q.from || !q.to || q.from <= q.to, { path: ['to'], message: 'The end of the range is before its start' });
export type CostEntryListQuery = z.output<typeof costEntryListQuerySchema>;

// ---------------------------------------------------------------- machine page

export const machineSummaryQuerySchema = z.strictObject({
  year: wholeNumberInput({ atLeast: 1900, atMost: 2100 }).optional(),
  /** Planning assumptions for the estimate; defaults are reported with the inputs used. */
  interestRatePct: scaledDecimal({ atLeast: 0, atMost: 30 }, 2).optional(),
  fuelPricePerGallon: scaledDecimal({ above: 0, atMost: 50 }, 3).optional(),
});
export type MachineSummaryQuery = z.output<typeof machineSummaryQuerySchema>;

// ---------------------------------------------------------------- responses (decimals as strings)

export interface MachineOwnerDto {
  partyId: string;
  name: string;
  sharePct: string;
}

export interface MachineDto {
  id: string;
  name: string;
  classId: MachineClassId;
  classLabel: string;
  kind: MachineKind;
  make: string | null;
  model: string | null;
  year: number | null;
  serialNumber: string | null;
  unitNumber: string | null;
  ptoHp: string | null;
  fuelType: FuelType | null;
  widthFt: string | null;
  purchaseDate: string | null;
  hoursAtPurchase: string;
  plannedYearsOwned: number | null;
  plannedHoursPerYear: string | null;
  speedMph: string | null;
  fieldEfficiencyPct: string | null;
  repairFactor1: string | null;
  repairFactor2: string | null;
  status: MachineStatus;
  photoUploadId: string | null;
  notes: string | null;
  /** The share set in force today. */
  owners: MachineOwnerDto[];
  /** The newest hour-meter reading (null when never read); given by the list and the single read. */
  lastReading?: { readAt: string; hours: string; totalHours: string } | null;
  /** Money roles only; left out for operators. */
  listPrice?: string | null;
  purchasePrice?: string | null;
  createdAt: string;
  updatedAt: string;
}

export interface ShareSetDto {
  effectiveFrom: string;
  shares: MachineOwnerDto[];
}

export interface MachineSharesDto {
  /** The day asked about (today unless `on` was given). */
  on: string;
  /** The set in force on that day; null before the first set. */
  current: ShareSetDto | null;
  /** Every set, latest effective date first. */
  history: ShareSetDto[];
}

export interface MeterReadingDto {
  id: string;
  readAt: string;
  hours: string;
  kind: MeterReadingKind;
  offsetHours: string;
  /** offsetHours + hours: the machine's hours over all its meters. */
  totalHours: string;
  source: 'manual' | 'work-entry' | 'cost-entry' | 'import';
  workEntryId: string | null;
  note: string | null;
}

export interface CostEntryDto {
  id: string;
  machineId: string;
  category: CostCategory;
  incurredOn: string;
  amount: string;
  gallons: string | null;
  meterHours: string | null;
  vendor: string | null;
  paidByPartyId: string | null;
  paidByName: string | null;
  improvementLifeYears: number | null;
  receiptUploadId: string | null;
  notes: string | null;
  createdAt: string;
  updatedAt: string;
}

export interface CostEntryPage {
  items: CostEntryDto[];
  total: number;
  page: number;
  pageSize: number;
  /** Over every row the filter matches, not only this page. */
  totals: { amount: string; gallons: string };
}

export interface MachineHoursDto {
  /** The hours used: the larger of the two measures below. */
  hours: string;
  source: 'meter' | 'entries';
  /** Difference of total meter hours across the period; null without two readings to compare. */
  meterHours: string | null;
  /** Sum of the hours of submitted and later work entries with this machine. */
  entryHours: string;
}

export interface RateInputDto {
  name: string;
  value: string;
  source: 'machine' | 'class-default' | 'query' | 'year-records' | 'method-default';
}

export type CategoryAmountsDto = Record<CostCategory | 'total', string>;

export interface MachineSummaryDto {
  machine: MachineDto;
  year: number;
  meterHistory: MeterReadingDto[];
  usage: MachineHoursDto & { acres: string };
  /** Money roles only. */
  costTotals?: { byCategory: CategoryAmountsDto; fuelGallons: string };
  estimatedRate?:
    | {
        available: true;
        method: 'capital-recovery';
        perHour: Record<'capitalRecovery' | 'tih' | 'ownership' | 'repairs' | 'fuel' | 'lube' | 'labor' | 'operating' | 'total', string>;
        perYear: Record<'capitalRecovery' | 'tih' | 'ownership' | 'repairs' | 'fuel' | 'lube' | 'labor' | 'operating' | 'total', string>;
        salvageValue: string;
        remainingValuePct: string;
        inputs: RateInputDto[];
      }
    | { available: false; reason: string };
  actualRate?: { perYear: CategoryAmountsDto; perHour: CategoryAmountsDto | null; perAcre: CategoryAmountsDto | null };
  notice: string;
}

// ---------------------------------------------------------------- uploads (receipts, photos, boundaries)

export const UPLOAD_PURPOSES = ['receipt', 'machine-photo', 'entry-photo', 'field-boundary'] as const;
export type UploadPurpose = (typeof UPLOAD_PURPOSES)[number];

export { MAX_UPLOAD_BYTES } from '../upload-limits.js';

/** The form fields beside `file` in POST /api/uploads (multipart/form-data). */
export const uploadFieldsSchema = z.strictObject({ purpose: oneOf(UPLOAD_PURPOSES) });

export interface UploadDto {
  id: string;
  purpose: UploadPurpose;
  originalName: string;
  /** What the content was found to be, not what the client claimed. */
  contentType: string;
  sizeBytes: number;
  sha256: string;
  createdAt: string;
}
