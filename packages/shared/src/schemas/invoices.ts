import { z } from 'zod';
import { emailSchema, singleLineText, uuidSchema } from './common.js';
import { moneyInput, scaledDecimal } from './rate-sheets.js';
import { isoDateSchema } from './work-entries.js';

/**
 * Stored status is draft, issued or void; the state a person sees also follows from payments and dates:
 * paid when nothing is left to pay, overdue when the due date has passed with money still owed,
 * partly-paid when some but not all has been paid before the due date.
 */
export const INVOICE_STATES = ['draft', 'issued', 'partly-paid', 'paid', 'overdue', 'void'] as const;
export type InvoiceState = (typeof INVOICE_STATES)[number];
export const INVOICE_KINDS = ['invoice', 'credit-note'] as const;
export type InvoiceKind = (typeof INVOICE_KINDS)[number];
export const MANUAL_PAYMENT_METHODS = ['cheque', 'cash', 'transfer'] as const;
export const PAYMENT_METHODS = ['card', ...MANUAL_PAYMENT_METHODS] as const;
export type PaymentMethod = (typeof PAYMENT_METHODS)[number];
export const INVOICE_LINE_KINDS = ['work', 'minimum', 'travel', 'fuel-adjustment', 'labour', 'adjustment', 'discount'] as const;
export type InvoiceLineKind = (typeof INVOICE_LINE_KINDS)[number];

function oneOf<const T extends readonly [string, ...string[]]>(values: T) {
  return z.enum(values, { error: (issue) => (issue.input === undefined ? 'Required' : `Use one of: ${values.join(', ')}`) });
}

const notesSchema = z
  .string()
  .trim()
  .max(2000, { message: 'At most 2000 characters.' })
  .nullish()
  .transform((s) => (s ? s : null));

const datesInOrder = (v: { from?: string; to?: string }) => !v.from || !v.to || v.from <= v.to;
const datesInOrderIssue = { path: ['to'], message: 'The end date is before the start date.' };

/** `POST /api/invoices/drafts`: a draft from the party's approved, unbilled entries dated from..to. */
export const invoiceDraftCreateSchema = z
  .strictObject({
    partyId: uuidSchema,
    from: isoDateSchema,
    to: isoDateSchema,
    /** Needed when the rate sheet adjusts for fuel: the diesel price the adjustment is taken against. */
    dieselPricePerGallon: scaledDecimal({ above: 0, atMost: 100 }, 4).optional(),
    /** Miles to the party's place and back, billed per visit at the sheet's travel rate per mile. */
    travelMilesPerVisit: scaledDecimal({ atLeast: 0, atMost: 10_000 }, 3).optional(),
    notes: notesSchema,
  })
  .refine(datesInOrder, datesInOrderIssue);
export type InvoiceDraftCreateInput = z.input<typeof invoiceDraftCreateSchema>;
export type InvoiceDraftCreate = z.output<typeof invoiceDraftCreateSchema>;

export const extraLineSchema = z.strictObject({
  description: singleLineText(200),
  quantity: scaledDecimal({ above: 0, atMost: 1_000_000 }, 3),
  unit: singleLineText(20),
  rate: scaledDecimal({ atLeast: 0, atMost: 1_000_000 }, 4),
});

export const discountSchema = z.discriminatedUnion(
  'kind',
  [
    z.strictObject({ kind: z.literal('amount'), description: singleLineText(200), amount: moneyInput({ above: 0 }) }),
    z.strictObject({ kind: z.literal('percent'), description: singleLineText(200), percent: scaledDecimal({ above: 0, atMost: 100 }, 2) }),
  ],
  { error: 'A discount is { kind: "amount", amount } or { kind: "percent", percent }, with a description.' },
);

/**
 * `PATCH /api/invoices/:id` on a draft, with the version it was read at (a stale one is a 409).
 * `extraLines` replaces the owner's added lines; `discount: null` removes the discount.
 */
export const invoiceDraftUpdateSchema = z
  .strictObject({
    version: z.number({ error: 'Send the version you edited.' }).int().min(1),
    notes: notesSchema.optional(),
    termsDays: z.number({ error: 'Enter a whole number of days.' }).int({ message: 'Enter a whole number of days.' }).min(0).max(365).optional(),
    extraLines: z.array(extraLineSchema).max(50, { message: 'At most 50 added lines.' }).optional(),
    discount: discountSchema.nullable().optional(),
  })
  .refine((v) => Object.keys(v).some((k) => k !== 'version'), { message: 'Nothing to change.' });
export type InvoiceDraftUpdateInput = z.input<typeof invoiceDraftUpdateSchema>;
export type InvoiceDraftUpdate = z.output<typeof invoiceDraftUpdateSchema>;

/** `POST /api/invoices/:id/issue`; the version, when sent, must match the draft's. */
export const invoiceIssueSchema = z.strictObject({
  version: z.number().int().min(1).optional(),
});

/** The optional `Idempotency-Key` header of issue: a retry with the same key returns the same invoice. */
export const idempotencyKeySchema = z
  .string()
  .min(8, { message: 'At least 8 characters.' })
  .max(255, { message: 'At most 255 characters.' })
  .regex(/^[A-Za-z0-9_\-:.]+$/, { message: 'Letters, digits and - _ : . only.' });

export const invoiceVoidSchema = z.strictObject({ reason: singleLineText(500) });

export const creditLineSchema = z.strictObject({
  description: singleLineText(200),
  /** What is credited, as a positive amount; the credit note stores and prints it negative. */
  amount: moneyInput({ above: 0 }),
});

/**
 * `POST /api/invoices/:id/credit-notes`. Without `lines` the credit note reverses every line of the
 * original (only when nothing was credited on it before); with `lines` it credits those amounts.
 */
export const creditNoteCreateSchema = z.strictObject({
  reason: singleLineText(500),
  lines: z.array(creditLineSchema).min(1, { message: 'Give at least one line, or leave lines out to credit the whole invoice.' }).max(50).optional(),
});
export type CreditNoteCreate = z.output<typeof creditNoteCreateSchema>;

/** `POST /api/invoices/:id/payments`: a payment received outside the card checkout. */
export const manualPaymentSchema = z.strictObject({
  method: oneOf(MANUAL_PAYMENT_METHODS),
  amount: moneyInput({ above: 0 }),
  receivedOn: isoDateSchema,
  reference: singleLineText(120).nullish(),
});
export type ManualPayment = z.output<typeof manualPaymentSchema>;

/** `POST /api/invoices/:id/payments/:paymentId/refund`: card money handed back through Stripe; all that is left of the payment when no amount is given. */
export const paymentRefundSchema = z.strictObject({
  amount: moneyInput({ above: 0 }).optional(),
  reason: singleLineText(200).nullish(),
});
export type PaymentRefundInput = z.output<typeof paymentRefundSchema>;

/** `POST /api/invoices/:id/send`: to the party's e-mail address unless another is given. */
export const invoiceSendSchema = z.strictObject({ to: emailSchema.optional() });

/** `POST /api/invoices/:id/checkout` takes no fields: the amount always comes from the server. */
export const invoiceCheckoutSchema = z.strictObject({});

const stateListSchema = z
  .string()
  .max(100)
  .transform((s) => s.split(',').map((p) => p.trim()).filter(Boolean))
  .pipe(z.array(oneOf(INVOICE_STATES)).min(1));

export const INVOICE_SORTS = ['issueDate', '-issueDate', 'dueDate', '-dueDate', 'number', '-number', 'total', '-total', 'createdAt', '-createdAt'] as const;

/** Dates filter on the issue date (drafts, which have none, on the day they were made). */
export const invoiceListQuerySchema = z
  .strictObject({
    page: z.coerce.number().int().min(1).max(100000).default(1),
    pageSize: z.coerce.number().int().min(1).max(200).default(25),
    partyId: uuidSchema.optional(),
    state: stateListSchema.optional(),
    kind: oneOf(INVOICE_KINDS).optional(),
    from: isoDateSchema.optional(),
    to: isoDateSchema.optional(),
    sort: oneOf(INVOICE_SORTS).default('-createdAt'),
  })
  .refine(datesInOrder, datesInOrderIssue);
export type InvoiceListQuery = z.output<typeof invoiceListQuerySchema>;

// ---- Response shapes (money and quantities as decimal strings, dates as YYYY-MM-DD) ----

export interface InvoiceLineDto {
  id: string;
  position: number;
  kind: InvoiceLineKind;
  workEntryId: string | null;
  workDate: string | null;
  description: string;
  fieldName: string | null;
  workTypeName: string | null;
  quantity: string | null;
  unit: string | null;
  rate: string | null;
  amount: string;
}

/** A work entry billed on the invoice, as the customer may see it: no machines, costs or operators. */
export interface InvoiceEntryDto {
  id: string;
  workDate: string;
  fieldName: string;
  workTypeName: string;
  hours: string;
  acres: string | null;
  miles: string | null;
  loads: string | null;
  eachCount: string | null;
}

export interface PartySnapshotDto {
  name: string;
  email: string | null;
  phone: string | null;
  address: string | null;
}

export interface InvoiceSummaryDto {
  id: string;
  kind: InvoiceKind;
  series: string;
  number: number | null;
  /** "INV-0007" or "CN-0002"; null for a draft. */
  numberLabel: string | null;
  partyId: string;
  partyName: string;
  status: 'draft' | 'issued' | 'void';
  state: InvoiceState;
  periodFrom: string | null;
  periodTo: string | null;
  issueDate: string | null;
  dueDate: string | null;
  termsDays: number;
  subtotal: string;
  total: string;
  amountPaid: string;
  /** Issued credit notes against this invoice, as a positive amount. */
  amountCredited: string;
  /** total − paid − credited; 0 for drafts, void invoices and credit notes. */
  balance: string;
  creditOfInvoiceId: string | null;
  sentAt: string | null;
  version: number;
  createdAt: string;
}

export interface InvoiceDto extends InvoiceSummaryDto {
  notes: string | null;
  voidedAt: string | null;
  voidReason: string | null;
  issuedAt: string | null;
  /** As printed: the operation's and the party's details, frozen when issued (live for a draft). */
  issuer: PartySnapshotDto;
  party: PartySnapshotDto;
  lines: InvoiceLineDto[];
  /** How many work entries the lines bill. */
  entryCount: number;
  /**
   * The billed entries, in the customer's view only: the customer's page lists them, while the office reads
   * the same dates, fields and quantities off the lines, so its answers (issuing 500 entries) stay half the size.
   */
  entries?: InvoiceEntryDto[];
  creditOf: { id: string; numberLabel: string | null } | null;
  creditNotes: Array<{ id: string; numberLabel: string | null; total: string; status: 'issued' | 'void' }>;
  /** The web page a customer opens to see and pay the invoice. */
  payUrl: string | null;
}

export interface PaymentDto {
  id: string;
  invoiceId: string;
  method: PaymentMethod;
  amount: string;
  receivedOn: string;
  reference: string | null;
  status: 'succeeded' | 'refunded';
  /** Handed back by card refund so far; the invoice counts amount − amountRefunded as paid. */
  amountRefunded: string;
  /** Set when this money should go back to the payer (it arrived for a void or already paid invoice). */
  refundDue: string | null;
  createdAt: string;
}

export interface ManualPaymentResultDto {
  payment: PaymentDto;
  /** The invoice after the payment, with its new state and balance. */
  invoice: InvoiceSummaryDto;
}

export interface InvoiceSendDto {
  queued: true;
  to: string;
}

export interface CheckoutDto {
  /** The hosted checkout page to send the payer to. */
  url: string;
  amount: string;
  currency: string;
  expiresAt: string | null;
}
