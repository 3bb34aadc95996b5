import type { Decimal } from 'decimal.js';
import { z } from 'zod';
import type { CostCategory } from '../actual-rate.js';
import type { MachineClassId, MachineKind } from '../machine-classes.js';
import { uuidSchema } from './common.js';
import { decimalInput, wholeNumberInput } from './decimal-input.js';

// Requests and responses of /api/reports. Money, hours and acres travel as decimal strings.

/** Interest on the machine investment when the caller gives none: Iowa State AgDM A3-29 (2015) example, 8 %. */
export const DEFAULT_INTEREST_RATE_PCT = '8';
/**
 * Margin added to cost for next year's suggested machine-hour rate: the middle of the 5–15 % that
 * cost-based custom rates add to estimated cost (Univ. of Illinois farmdoc, Machinery Cost Estimates, 2008).
 */
export const DEFAULT_MARGIN_PCT = '10';
/** A machine is flagged when its logged costs per hour run this far above the estimate for the same items. */
export const ABOVE_ESTIMATE_FLAG_PCT = '25';

const yearInput = () => wholeNumberInput({ atLeast: 2000, atMost: 2100 });
const pctInput = (atMost: number) =>
  decimalInput({ atLeast: 0, atMost }).refine((value: Decimal) => value.decimalPlaces() <= 2, { message: 'At most 2 decimal places' });

const assumptions = {
  /** Real or nominal interest on the investment, per cent a year. */
  interestRatePct: pctInput(30).optional(),
  /** Added to cost for the suggested rate, per cent. */
  marginPct: pctInput(100).optional(),
};

/** `GET /api/reports/machine-rates?year=` (and `.csv`, `.pdf`). */
export const machineRatesQuerySchema = z.strictObject({ year: yearInput(), ...assumptions });
export type MachineRatesQuery = z.output<typeof machineRatesQuerySchema>;

/** `POST /api/reports/machine-rates/accept`: the suggestions of `year` become a family rate sheet from 1 January of the next year. */
export const acceptSuggestedRatesSchema = z.strictObject({
  year: yearInput(),
  machineIds: z
    .array(uuidSchema)
    .min(1, { message: 'Pick at least one machine.' })
    .max(200, { message: 'At most 200 machines.' })
    .refine((ids) => new Set(ids).size === ids.length, { message: 'Each machine only once.' }),
  /** The family sheet whose other rates and terms the new sheet copies; by default the one in force at the end of `year`. */
  rateSheetId: uuidSchema.optional(),
  ...assumptions,
});
export type AcceptSuggestedRates = z.output<typeof acceptSuggestedRatesSchema>;

/** `GET /api/reports/custom-income?year=` (and `.csv`). */
export const customIncomeQuerySchema = z.strictObject({ year: yearInput() });
export type CustomIncomeQuery = z.output<typeof customIncomeQuerySchema>;

// ---------------------------------------------------------------- responses

export type CategoryAmountsDto = Record<CostCategory | 'total', string>;
export type EstimateBreakdownDto = Record<'capitalRecovery' | 'tih' | 'ownership' | 'repairs' | 'fuel' | 'lube' | 'labor' | 'operating' | 'total', string>;

export interface EstimateInputDto {
  name: string;
  value: string;
  /** machine: its own record; year-records: the year's logs; rate-sheet: the family sheet; class-default / method-default: published defaults. */
  source: 'machine' | 'year-records' | 'rate-sheet' | 'class-default' | 'method-default' | 'query';
}

export type MachineEstimateDto =
  | {
      available: true;
      perYear: EstimateBreakdownDto;
      perHour: EstimateBreakdownDto;
      salvageValue: string;
      remainingValuePct: string;
      inputs: EstimateInputDto[];
    }
  | { available: false; reason: string; inputs: EstimateInputDto[] };

export interface ComparisonRowDto {
  item: 'repairs' | 'fuel-and-lube' | 'tih';
  actualPerHour: string;
  estimatePerHour: string;
  differencePerHour: string;
}

export interface CustomRateDto {
  /** invoices: issued invoice lines for the machine's work; rate-sheet: the neighbour sheet's acre rates for its work types. */
  source: 'invoices' | 'rate-sheet' | null;
  perAcre: string | null;
  perHour: string | null;
  /** Invoiced amount for the machine's entries (invoices only). */
  revenue: string | null;
}

export interface BreakEvenDto {
  /** Acres a year above which owning beats hiring; null with a reason when it cannot be computed. */
  acres: string | null;
  annualFixedCost: string | null;
  customRatePerAcre: string | null;
  variableCostPerAcre: string | null;
  reason: string | null;
}

export type MachineRateFlagCode = 'actual-above-estimate' | 'below-break-even';

export interface MachineRateRowDto {
  machineId: string;
  name: string;
  classId: MachineClassId;
  classLabel: string;
  kind: MachineKind;
  status: 'active' | 'sold' | 'retired';
  hours: string;
  acres: string;
  costs: CategoryAmountsDto;
  perHour: CategoryAmountsDto | null;
  perAcre: CategoryAmountsDto | null;
  estimate: MachineEstimateDto;
  comparison: ComparisonRowDto[] | null;
  customRate: CustomRateDto;
  breakEven: BreakEvenDto;
  flags: Array<{ code: MachineRateFlagCode; message: string }>;
  /** The family sheet's machine-hour rate in force at the end of the year. */
  currentRate: { perHour: string; rateSheetId: string } | null;
  suggestedRate: { perHour: string; basis: 'actual' | 'estimate'; marginPct: string } | null;
}

export interface CostPerHourPointDto extends Record<CostCategory | 'total', string> {
  machineId: string;
  name: string;
}

export interface MachineRatesReportDto {
  year: number;
  interestRatePct: string;
  marginPct: string;
  machines: MachineRateRowDto[];
  /** Chart series: logged cost per hour by category, one bar per machine that worked. */
  charts: { costPerHourByCategory: CostPerHourPointDto[] };
  rules: string[];
}

/** `GET /api/reports/machine-hours`: hours per year per machine over the years with entries, for the fleet chart. */
export interface MachineHoursHistoryDto {
  years: number[];
  machines: Array<{ machineId: string; name: string; hours: string[] }>;
}

export interface AcceptedRatesDto {
  rateSheetId: string;
  name: string;
  effectiveFrom: string;
  copiedFromRateSheetId: string | null;
  machineRates: Array<{ machineId: string; name: string; ratePerHour: string }>;
}

export interface CustomIncomeReportDto {
  year: number;
  total: string;
  byCustomer: Array<{ partyId: string; name: string; relationship: 'family' | 'neighbour' | 'agency'; amount: string; invoices: number }>;
  byWorkType: Array<{ workType: string; unit: string | null; quantity: string | null; amount: string; lines: number }>;
  fields: Array<{
    fieldId: string;
    name: string;
    kind: 'field' | 'roadside';
    acres: string;
    hours: string;
    acresWorked: string;
    machineCost: string;
    /** machineCost ÷ the field's acres; null for a field of no acres. */
    costPerAcre: string | null;
  }>;
  /** Machine costs of machines that logged no hours on any field this year. */
  unallocatedMachineCost: string;
  rules: string[];
}

// ---------------------------------------------------------------- dashboard (GET /api/dashboard)

/** A figure on the signed-in home, ready to show: counts as digits, money formatted ("$1,234.50"). */
export interface DashboardCardDto {
  key: string;
  label: string;
  value: string;
  hint?: string;
}

/** A small chart: points in order, values as decimal strings in the chart's unit. */
export interface DashboardChartDto {
  key: string;
  label: string;
  kind: 'bar' | 'line';
  unit: 'hours' | 'usd';
  points: Array<{ label: string; value: string }>;
  hint?: string;
}

export interface DashboardDto {
  cards: DashboardCardDto[];
  charts: DashboardChartDto[];
}
