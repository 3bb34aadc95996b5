import type { Decimal } from 'decimal.js';
import { z } from 'zod';
import { WORK_UNITS, type WorkUnit } from '../work-types.js';
import { singleLineText, uuidSchema } from './common.js';
import { decimalInput, type DecimalRules } from './decimal-input.js';
import { isoDateSchema } from './work-entries.js';

export const RATE_RELATIONSHIPS = ['family', 'neighbour', 'agency'] as const;
export type RateRelationship = (typeof RATE_RELATIONSHIPS)[number];
/** 'custom': machine, tractor, fuel and operator; 'rental': the machine alone. */
export const CHARGE_TYPES = ['custom', 'rental'] as const;
export type ChargeTypeName = (typeof CHARGE_TYPES)[number];
export const MINIMUM_PER = ['entry', 'visit'] as const;

/** A decimal that also fits its database column's scale (money to the cent, rates to 4 places). */
export function scaledDecimal(rules: DecimalRules, decimals: number) {
  return decimalInput(rules).refine((value: Decimal) => value.decimalPlaces() <= decimals, {
    message: `At most ${decimals} decimal place${decimals === 1 ? '' : 's'}`,
  });
}

const MAX_MONEY = 1_000_000_000;
export const moneyInput = (rules: DecimalRules = { atLeast: 0 }) => scaledDecimal({ atMost: MAX_MONEY, ...rules }, 2);
const rateInput = () => scaledDecimal({ atLeast: 0, atMost: 1_000_000 }, 4);

function oneOf<const T extends readonly [string, ...string[]]>(values: T) {
  return z.enum(values, { error: (issue) => (issue.input === undefined ? 'Required' : `Use one of: ${values.join(', ')}`) });
}

const notesSchema = z
  .string()
  .trim()
  .max(2000, { message: 'At most 2000 characters.' })
  .nullish()
  .transform((s) => (s ? s : null));

export const rateSheetLineSchema = z.strictObject({
  workTypeId: uuidSchema,
  unit: oneOf(WORK_UNITS),
  chargeType: oneOf(CHARGE_TYPES).default('custom'),
  rate: rateInput(),
  /** This line's own minimum; null or left out uses the sheet's minimum. */
  minimumCharge: moneyInput().nullish(),
});

export const machineRateSchema = z.strictObject({
  machineId: uuidSchema,
  ratePerHour: rateInput(),
});

/**
 * Diesel above the base price by whole steps raises custom rates by pctPerStep per step (and lowers them
 * below it); rentals are not adjusted because the renter buys the fuel.
 */
export const fuelAdjustmentSchema = z.strictObject({
  basePricePerGallon: scaledDecimal({ above: 0, atMost: 100 }, 4),
  stepPerGallon: scaledDecimal({ above: 0, atMost: 100 }, 4),
  pctPerStep: scaledDecimal({ atLeast: 0, atMost: 100 }, 4),
});

const lineKey = (l: { workTypeId: string; unit: string; chargeType: string }) => `${l.workTypeId}|${l.unit}|${l.chargeType}`;

function checkUniqueLines(lines: ReadonlyArray<{ workTypeId: string; unit: string; chargeType: string }> | undefined, ctx: z.RefinementCtx): void {
  const seen = new Set<string>();
  lines?.forEach((line, index) => {
    const key = lineKey(line);
    if (seen.has(key)) ctx.addIssue({ code: 'custom', path: ['lines', index], message: 'This work type already has a rate in this unit and charge type.' });
    seen.add(key);
  });
}

function checkUniqueMachines(rates: ReadonlyArray<{ machineId: string }> | undefined, ctx: z.RefinementCtx): void {
  const seen = new Set<string>();
  rates?.forEach((rate, index) => {
    if (seen.has(rate.machineId)) ctx.addIssue({ code: 'custom', path: ['machineRates', index, 'machineId'], message: 'This machine already has a rate on this sheet.' });
    seen.add(rate.machineId);
  });
}

const sheetFields = {
  name: singleLineText(120),
  relationship: oneOf(RATE_RELATIONSHIPS),
  /** Set for a sheet that overrides the relationship's sheet for one party. */
  partyId: uuidSchema.nullish(),
  effectiveFrom: isoDateSchema,
  minimumCharge: moneyInput(),
  minimumPer: oneOf(MINIMUM_PER),
  travelFlat: moneyInput(),
  travelPerMile: rateInput(),
  fuelAdjustment: fuelAdjustmentSchema.nullish(),
  /** Wage billed for an operator sent with a rental, per labour hour. */
  operatorWage: moneyInput(),
  /** Labour hours per machine hour (travel, fuelling, greasing). */
  laborFactor: scaledDecimal({ atLeast: 1, atMost: 5 }, 3),
  /** Invoices priced with this sheet are due this many days after issue. */
  termsDays: z.number({ error: 'Enter a whole number of days.' }).int({ message: 'Enter a whole number of days.' }).min(0).max(365),
  notes: notesSchema,
  lines: z.array(rateSheetLineSchema).max(200, { message: 'At most 200 rate lines.' }),
  machineRates: z.array(machineRateSchema).max(200, { message: 'At most 200 machine rates.' }),
};

export const rateSheetCreateSchema = z
  .strictObject({
    ...sheetFields,
    minimumCharge: sheetFields.minimumCharge.prefault(0),
    minimumPer: sheetFields.minimumPer.default('entry'),
    travelFlat: sheetFields.travelFlat.prefault(0),
    travelPerMile: sheetFields.travelPerMile.prefault(0),
    operatorWage: sheetFields.operatorWage.prefault(0),
    laborFactor: sheetFields.laborFactor.prefault('1.1'),
    termsDays: sheetFields.termsDays.default(30),
    lines: sheetFields.lines.default([]),
    machineRates: sheetFields.machineRates.default([]),
  })
  .superRefine((v, ctx) => {
    checkUniqueLines(v.lines, ctx);
    checkUniqueMachines(v.machineRates, ctx);
  });
export type RateSheetCreateInput = z.input<typeof rateSheetCreateSchema>;
export type RateSheetCreate = z.output<typeof rateSheetCreateSchema>;

/** Fields left out stay as they are; `lines` and `machineRates`, when sent, replace the whole list. */
export const rateSheetUpdateSchema = z
  .strictObject(sheetFields)
  .partial()
  .superRefine((v, ctx) => {
    if (Object.keys(v).length === 0) ctx.addIssue({ code: 'custom', path: [], message: 'Nothing to change.' });
    checkUniqueLines(v.lines, ctx);
    checkUniqueMachines(v.machineRates, ctx);
  });
export type RateSheetUpdateInput = z.input<typeof rateSheetUpdateSchema>;
export type RateSheetUpdate = z.output<typeof rateSheetUpdateSchema>;

export const rateSheetListQuerySchema = z.strictObject({
  page: z.coerce.number().int().min(1).max(100000).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(25),
  relationship: oneOf(RATE_RELATIONSHIPS).optional(),
  partyId: uuidSchema.optional(),
  /** 'true' lists archived sheets too. */
  includeArchived: z.enum(['true', 'false']).default('false').transform((s) => s === 'true'),
  sort: oneOf(['effectiveFrom', '-effectiveFrom', 'name', '-name'] as const).default('-effectiveFrom'),
});
export type RateSheetListQuery = z.output<typeof rateSheetListQuerySchema>;

/** Which sheet prices a party's work on a date: `GET /api/rate-sheets/in-force?partyId=&date=`. */
export const rateSheetInForceQuerySchema = z.strictObject({
  partyId: uuidSchema,
  date: isoDateSchema,
});

// ---- Response shapes (decimal strings throughout) ----

export interface RateSheetLineDto {
  id: string;
  workTypeId: string;
  workTypeName: string;
  unit: WorkUnit;
  chargeType: ChargeTypeName;
  rate: string;
  minimumCharge: string | null;
}

export interface MachineRateDto {
  id: string;
  machineId: string;
  machineName: string;
  ratePerHour: string;
}

export interface RateSheetDto {
  id: string;
  name: string;
  relationship: RateRelationship;
  partyId: string | null;
  partyName: string | null;
  effectiveFrom: string;
  minimumCharge: string;
  minimumPer: 'entry' | 'visit';
  travelFlat: string;
  travelPerMile: string;
  fuelAdjustment: { basePricePerGallon: string; stepPerGallon: string; pctPerStep: string } | null;
  operatorWage: string;
  laborFactor: string;
  termsDays: number;
  notes: string | null;
  archivedAt: string | null;
  createdAt: string;
  updatedAt: string;
  lines: RateSheetLineDto[];
  machineRates: MachineRateDto[];
}

/** The list leaves out lines and machine rates; fetch one sheet for them. */
export type RateSheetListItemDto = Omit<RateSheetDto, 'lines' | 'machineRates'> & { lineCount: number };

export interface RateSheetInForceDto {
  /** 'party-override' when the party has its own sheet in force on the date. */
  source: 'party-override' | 'relationship';
  sheet: RateSheetDto;
}
