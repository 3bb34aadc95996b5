import { z } from 'zod';
import { singleLineText, uuidSchema } from './common.js';
import { isoDateSchema } from './work-entries.js';

// Requests and responses of /api/square-ups. Money and hours travel as decimal strings.

export const FIXED_COSTS_BY = ['ownership', 'use'] as const;
export type FixedCostsBy = (typeof FIXED_COSTS_BY)[number];
export const SQUARE_UP_STATUSES = ['open', 'closed'] as const;
export type SquareUpStatus = (typeof SQUARE_UP_STATUSES)[number];
export const TRANSFER_METHODS = ['cheque', 'cash', 'transfer'] as const;
export type TransferMethod = (typeof TRANSFER_METHODS)[number];
export const STATEMENT_LINE_KINDS = ['cost', 'work'] as const;
export type StatementLineKind = (typeof STATEMENT_LINE_KINDS)[number];

/** A season or a year: a longer period is almost always a typing error in a date. */
export const MAX_PERIOD_DAYS = 366;

function oneOf<const T extends readonly [string, ...string[]]>(values: T) {
  return z.enum(values, { error: (issue) => (issue.input === undefined ? 'Required' : `Use one of: ${values.join(', ')}`) });
}

function daysBetween(from: string, to: string): number {
  return (Date.parse(`${to}T00:00:00Z`) - Date.parse(`${from}T00:00:00Z`)) / 86_400_000;
}

/** `POST /api/square-ups`. Periods of one operation may not overlap (409). */
export const squareUpCreateSchema = z
  .strictObject({
    name: singleLineText(120),
    periodFrom: isoDateSchema,
    periodTo: isoDateSchema,
    /** 'use' settles every cost by use, for owners who agreed so because their use differs from their shares. */
    fixedCostsBy: oneOf(FIXED_COSTS_BY).default('ownership'),
  })
  .superRefine((v, ctx) => {
    const days = daysBetween(v.periodFrom, v.periodTo);
    if (days < 0) ctx.addIssue({ code: 'custom', path: ['periodTo'], message: 'The period ends before it starts.' });
    else if (days + 1 > MAX_PERIOD_DAYS) ctx.addIssue({ code: 'custom', path: ['periodTo'], message: `A period covers at most ${MAX_PERIOD_DAYS} days.` });
  });
export type SquareUpCreateInput = z.input<typeof squareUpCreateSchema>;
export type SquareUpCreate = z.output<typeof squareUpCreateSchema>;

export const squareUpListQuerySchema = z.strictObject({
  page: z.coerce.number().int().min(1).max(100000).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(25),
  status: oneOf(SQUARE_UP_STATUSES).optional(),
});
export type SquareUpListQuery = z.output<typeof squareUpListQuerySchema>;

/**
 * `GET /api/square-ups/:id/statement/lines`: the cost entries (`kind=cost`) or the machine use of work
 * entries (`kind=work`) behind the statement's figures, optionally for one household and one machine.
 */
export const statementLinesQuerySchema = z.strictObject({
  kind: oneOf(STATEMENT_LINE_KINDS).default('cost'),
  household: uuidSchema.optional(),
  machine: uuidSchema.optional(),
  page: z.coerce.number().int().min(1).max(100000).default(1),
  pageSize: z.coerce.number().int().min(1).max(500).default(100),
});
export type StatementLinesQuery = z.output<typeof statementLinesQuerySchema>;

/** `POST /api/square-ups/:id/transfers/:transferId/paid`. */
export const transferPaidSchema = z.strictObject({
  paidOn: isoDateSchema,
  method: oneOf(TRANSFER_METHODS),
  reference: z
    .string()
    .trim()
    .max(120, { message: 'At most 120 characters.' })
    .refine((s) => !/[\r\n\u0000]/.test(s), { message: 'Must be a single line.' })
    .nullish()
    .transform((s) => s || null),
});
export type TransferPaid = z.output<typeof transferPaidSchema>;

// ---------------------------------------------------------------- responses

export interface SquareUpDto {
  id: string;
  name: string;
  periodFrom: string;
  periodTo: string;
  status: SquareUpStatus;
  fixedCostsBy: FixedCostsBy;
  closedAt: string | null;
  createdAt: string;
}

export interface SquareUpSummaryDto extends SquareUpDto {
  /** Closed periods only: the transfers of the frozen statement and how many are recorded paid. */
  transfers: number;
  transfersPaid: number;
  /** Closed periods only: what the households owed one another (the sum of positive balances). */
  positiveBalances: string | null;
}

/** Positive balance: the household is owed money; negative: it owes. balance = paid − share + useCredited − useCharged. */
export interface StatementHouseholdDto {
  householdId: string;
  name: string;
  /** What it paid towards machine costs in the period. */
  paid: string;
  /** Its part of those costs: fixed by ownership (or use), operating by use. */
  share: string;
  /** For its hours on machines it did not own that day. */
  useCharged: string;
  /** For other households' hours on machines it owned. */
  useCredited: string;
  balance: string;
}

export interface StatementSplitDto {
  householdId: string;
  amount: string;
}

/** One pot of a machine's costs split once on one basis, so rounding happens once per pot. */
export interface StatementPoolDto {
  basis: 'ownership' | 'use';
  /** Ownership pots: the share set in force on the costs' dates. */
  shareSetFrom: string | null;
  costKinds: Array<'fixed' | 'operating'>;
  /** Set when operating costs are split by ownership because no owner used the machine in the period. */
  reason: 'no-owner-use' | null;
  amount: string;
  paid: StatementSplitDto[];
  split: StatementSplitDto[];
}

export interface StatementMachineDto {
  machineId: string;
  name: string;
  fixedCosts: string;
  operatingCosts: string;
  /** Hours its owners used it, by household: the weights of the use split. */
  ownerHours: Array<{ householdId: string; hours: string }>;
  /** Hours other households used it (charged at the machine rate). */
  otherHours: string;
  pools: StatementPoolDto[];
}

export interface StatementUseChargeDto {
  machineId: string;
  machineName: string;
  householdId: string;
  hours: string;
  ratePerHour: string;
  /** 'rate-sheet': the family rate sheet in force on the work dates; 'actual-rate': none had a rate for the machine. */
  rateSource: 'rate-sheet' | 'actual-rate';
  rateSheetId: string | null;
  shareSetFrom: string;
  amount: string;
  /** To the owners, by their shares that day. */
  credits: StatementSplitDto[];
}

export interface StatementTransferDto {
  /** Null while the period is open: transfers are recorded when it closes. */
  id: string | null;
  position: number;
  fromHouseholdId: string;
  fromName: string;
  toHouseholdId: string;
  toName: string;
  amount: string;
  paidOn: string | null;
  method: TransferMethod | null;
  reference: string | null;
}

export type StatementWarningCode =
  | 'cost-without-payer'
  | 'cost-without-owners'
  | 'use-without-owners'
  | 'use-without-rate'
  | 'share-set-invalid'
  | 'entries-pending';

export interface StatementWarningDto {
  code: StatementWarningCode;
  message: string;
  machineId: string | null;
}

export interface StatementTotalsDto {
  /** Machine costs split in the statement. */
  costs: string;
  useCharges: string;
  /** What the households owe one another before the transfers: the sum of positive balances. */
  positiveBalances: string;
}

export interface SquareUpStatementDto {
  squareUp: SquareUpDto;
  /** True when this is the statement stored at closing, not a fresh computation. */
  frozen: boolean;
  computedAt: string;
  households: StatementHouseholdDto[];
  machines: StatementMachineDto[];
  useCharges: StatementUseChargeDto[];
  transfers: StatementTransferDto[];
  totals: StatementTotalsDto;
  /** Draft and submitted entries dated in the period: they count only once approved. */
  pendingEntries: number;
  warnings: StatementWarningDto[];
  /** The rules the figures follow, in words for the screen. */
  rules: string[];
}

export interface StatementCostLineDto {
  costEntryId: string;
  incurredOn: string;
  machineId: string;
  machineName: string;
  category: string;
  /** Improvements appear as their yearly slices: slice 1 of 5 is dated the day it was paid, slice 2 a year later. */
  improvementSlice: { index: number; of: number } | null;
  costKind: 'fixed' | 'operating';
  amount: string;
  paidByPartyId: string | null;
  paidByName: string | null;
  shareSetFrom: string | null;
  vendor: string | null;
  notes: string | null;
  /** With `household`: whether that household paid it and whether it bears a part of it. */
  paidByHousehold: boolean | null;
  bearsShare: boolean | null;
}

/** One machine's hours on one work entry, as the statement counts them. */
export interface StatementWorkLineDto {
  workEntryId: string;
  workDate: string;
  machineId: string;
  machineName: string;
  fieldName: string;
  workTypeName: string;
  hours: string;
  acres: string | null;
  billToName: string;
  /** Invoiced only for work billed outside the households on a household's field. */
  state: 'approved' | 'invoiced' | 'squared';
  /** The household whose use it is: billed to it, or run on its field. */
  householdId: string;
  householdName: string;
  /** Whether that household owned a share of the machine that day (no use charge) or not (charged). */
  userOwned: boolean;
  shareSetFrom: string | null;
}

export interface StatementLinePage<T> {
  items: T[];
  total: number;
  page: number;
  pageSize: number;
}

/** The drill-down answer, tagged with the kind asked for. */
export type StatementLinesDto = ({ kind: 'cost' } & StatementLinePage<StatementCostLineDto>) | ({ kind: 'work' } & StatementLinePage<StatementWorkLineDto>);

export interface TransferDto extends StatementTransferDto {
  id: string;
}
