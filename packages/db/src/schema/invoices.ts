import { sql } from 'drizzle-orm';
import { bigint, check, date, foreignKey, index, integer, jsonb, numeric, pgTable, primaryKey, text, timestamp, unique, uuid } from 'drizzle-orm/pg-core';
import { id, timestamps } from './columns.js';
import { operations } from './operations.js';
import { parties } from './parties.js';
import { users } from './users.js';
import { workEntries } from './work.js';

/** Gapless numbering: the next number of each series is a row locked by the issuing transaction. */
export const invoiceCounters = pgTable(
  'invoice_counters',
  {
    operationId: uuid()
      .notNull()
      .references(() => operations.id, { onDelete: 'cascade' }),
    series: text().notNull(),
    nextNumber: integer().notNull().default(1),
  },
  (t) => [primaryKey({ name: 'invoice_counters_pkey', columns: [t.operationId, t.series] })],
);

/**
 * Drafts have no number; issuing takes the next one and freezes the lines. Issued invoices are never
 * edited: they are voided or corrected by a credit note that refers to them.
 * Stored status is draft/issued/void; partly paid, paid and overdue follow from payments and dates.
 */
export const invoices = pgTable(
  'invoices',
  {
    id: id(),
    operationId: uuid()
      .notNull()
      .references(() => operations.id, { onDelete: 'cascade' }),
    kind: text({ enum: ['invoice', 'credit-note'] }).notNull().default('invoice'),
    series: text().notNull().default('INV'),
    number: integer(),
    partyId: uuid().notNull(),
    status: text({ enum: ['draft', 'issued', 'void'] }).notNull().default('draft'),
    periodFrom: date({ mode: 'string' }),
    periodTo: date({ mode: 'string' }),
    issueDate: date({ mode: 'string' }),
    dueDate: date({ mode: 'string' }),
    termsDays: integer().notNull().default(30),
    subtotal: numeric({ precision: 14, scale: 2 }).notNull().default('0'),
    total: numeric({ precision: 14, scale: 2 }).notNull().default('0'),
    amountPaid: numeric({ precision: 14, scale: 2 }).notNull().default('0'),
    notes: text(),
    creditOfInvoiceId: uuid(),
    /** The operation's and the party's details as printed when issued. */
    issuerSnapshot: jsonb(),
    partySnapshot: jsonb(),
    issuedAt: timestamp({ withTimezone: true }),
    issuedBy: uuid().references(() => users.id, { onDelete: 'set null' }),
    voidedAt: timestamp({ withTimezone: true }),
    voidReason: text(),
    sentAt: timestamp({ withTimezone: true }),
    version: integer().notNull().default(1),
    createdBy: uuid().references(() => users.id, { onDelete: 'set null' }),
    ...timestamps,
  },
  (t) => [
    unique('invoices_operation_id_id_key').on(t.operationId, t.id),
    unique('invoices_operation_series_number_key').on(t.operationId, t.series, t.number),
    foreignKey({ name: 'invoices_party_fk', columns: [t.operationId, t.partyId], foreignColumns: [parties.operationId, parties.id] }).onDelete('restrict'),
    foreignKey({ name: 'invoices_credit_of_fk', columns: [t.operationId, t.creditOfInvoiceId], foreignColumns: [t.operationId, t.id] }).onDelete('restrict'),
    index('invoices_operation_party_status_idx').on(t.operationId, t.partyId, t.status),
    index('invoices_operation_status_due_idx').on(t.operationId, t.status, t.dueDate),
    index('invoices_operation_number_idx').on(t.operationId, t.number),
    // The lists' default order (newest first, then id), for the whole operation or for one customer: a page is read off the index.
    index('invoices_operation_created_idx').on(t.operationId, t.createdAt.desc().nullsFirst(), t.id),
    index('invoices_operation_party_created_idx').on(t.operationId, t.partyId, t.createdAt.desc().nullsFirst(), t.id),
    // Every listed invoice's balance subtracts its credit notes: a lookup per row, not a scan.
    index('invoices_operation_credit_of_idx').on(t.operationId, t.creditOfInvoiceId).where(sql`${t.creditOfInvoiceId} is not null`),
    check('invoices_kind_check', sql`${t.kind} in ('invoice', 'credit-note')`),
    check('invoices_status_check', sql`${t.status} in ('draft', 'issued', 'void')`),
    check('invoices_number_when_issued_check', sql`(${t.status} = 'draft') = (${t.number} is null)`),
    check('invoices_credit_note_check', sql`(${t.kind} = 'credit-note') = (${t.creditOfInvoiceId} is not null)`),
  ],
);

export const INVOICE_LINE_KINDS = ['work', 'minimum', 'travel', 'fuel-adjustment', 'labour', 'adjustment', 'discount'] as const;

export const invoiceLines = pgTable(
  'invoice_lines',
  {
    id: id(),
    operationId: uuid().notNull(),
    invoiceId: uuid().notNull(),
    position: integer().notNull(),
    kind: text({ enum: INVOICE_LINE_KINDS }).notNull(),
    workEntryId: uuid(),
    workDate: date({ mode: 'string' }),
    description: text().notNull(),
    fieldName: text(),
    workTypeName: text(),
    quantity: numeric({ precision: 12, scale: 3 }),
    unit: text(),
    rate: numeric({ precision: 14, scale: 4 }),
    amount: numeric({ precision: 14, scale: 2 }).notNull(),
    details: jsonb(),
  },
  (t) => [
    foreignKey({ name: 'invoice_lines_invoice_fk', columns: [t.operationId, t.invoiceId], foreignColumns: [invoices.operationId, invoices.id] }).onDelete('cascade'),
    unique('invoice_lines_invoice_position_key').on(t.invoiceId, t.position),
    index('invoice_lines_work_entry_idx').on(t.workEntryId),
    // A year's billed work, read by date for the machine figures of that year.
    index('invoice_lines_operation_work_date_idx').on(t.operationId, t.workDate).where(sql`${t.kind} = 'work'`),
  ],
);

/**
 * The lock that makes billing an entry twice impossible: an entry appears here at most once, for the
 * draft or invoice that bills it. Deleting the draft or voiding the invoice deletes its rows, so the entry can be
 * billed again.
 */
export const invoiceEntries = pgTable(
  'invoice_entries',
  {
    workEntryId: uuid().notNull(),
    operationId: uuid().notNull(),
    invoiceId: uuid().notNull(),
  },
  (t) => [
    primaryKey({ name: 'invoice_entries_pkey', columns: [t.workEntryId] }),
    foreignKey({ name: 'invoice_entries_entry_fk', columns: [t.operationId, t.workEntryId], foreignColumns: [workEntries.operationId, workEntries.id] }).onDelete('restrict'),
    foreignKey({ name: 'invoice_entries_invoice_fk', columns: [t.operationId, t.invoiceId], foreignColumns: [invoices.operationId, invoices.id] }).onDelete('cascade'),
    index('invoice_entries_invoice_idx').on(t.invoiceId),
  ],
);

export const payments = pgTable(
  'payments',
  {
    id: id(),
    operationId: uuid().notNull(),
    invoiceId: uuid().notNull(),
    method: text({ enum: ['card', 'cheque', 'cash', 'transfer'] }).notNull(),
    amount: numeric({ precision: 14, scale: 2 }).notNull(),
    receivedOn: date({ mode: 'string' }).notNull(),
    reference: text(),
    stripePaymentIntentId: text().unique('payments_stripe_payment_intent_key'),
    stripeCheckoutSessionId: text(),
    status: text({ enum: ['succeeded', 'refunded'] }).notNull().default('succeeded'),
    /** Handed back through Stripe so far; the invoice counts only amount − amountRefunded as paid. */
    amountRefunded: numeric({ precision: 14, scale: 2 }).notNull().default('0'),
    /** Why the owner should refund this payment (money that arrived for a void or already paid invoice); null when nothing is owed back. */
    refundDue: text(),
    createdBy: uuid().references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    foreignKey({ name: 'payments_invoice_fk', columns: [t.operationId, t.invoiceId], foreignColumns: [invoices.operationId, invoices.id] }).onDelete('restrict'),
    unique('payments_operation_id_id_key').on(t.operationId, t.id),
    index('payments_operation_invoice_idx').on(t.operationId, t.invoiceId),
    check('payments_amount_check', sql`${t.amount} > 0`),
    check('payments_amount_refunded_check', sql`${t.amountRefunded} >= 0 and ${t.amountRefunded} <= ${t.amount}`),
    check('payments_method_check', sql`${t.method} in ('card', 'cheque', 'cash', 'transfer')`),
  ],
);

/** A refund of a card payment, once per Stripe refund id: the owner's request and Stripe's event about it are the same row. */
export const paymentRefunds = pgTable(
  'payment_refunds',
  {
    id: id(),
    operationId: uuid().notNull(),
    paymentId: uuid().notNull(),
    stripeRefundId: text().notNull().unique('payment_refunds_stripe_refund_key'),
    amount: numeric({ precision: 14, scale: 2 }).notNull(),
    reason: text(),
    createdBy: uuid().references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    foreignKey({ name: 'payment_refunds_payment_fk', columns: [t.operationId, t.paymentId], foreignColumns: [payments.operationId, payments.id] }).onDelete('restrict'),
    index('payment_refunds_payment_idx').on(t.operationId, t.paymentId),
    check('payment_refunds_amount_check', sql`${t.amount} > 0`),
  ],
);

/** A Checkout Session opened for an invoice's open balance; the amount always comes from the server. */
export const checkoutSessions = pgTable(
  'checkout_sessions',
  {
    id: id(),
    operationId: uuid().notNull(),
    invoiceId: uuid().notNull(),
    stripeSessionId: text().notNull().unique('checkout_sessions_stripe_session_key'),
    amountCents: bigint({ mode: 'number' }).notNull(),
    currency: text().notNull().default('usd'),
    status: text({ enum: ['open', 'complete', 'expired'] }).notNull().default('open'),
    url: text().notNull(),
    createdBy: uuid().references(() => users.id, { onDelete: 'set null' }),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    expiresAt: timestamp({ withTimezone: true }),
  },
  (t) => [
    foreignKey({ name: 'checkout_sessions_invoice_fk', columns: [t.operationId, t.invoiceId], foreignColumns: [invoices.operationId, invoices.id] }).onDelete('cascade'),
    index('checkout_sessions_invoice_idx').on(t.invoiceId),
  ],
);

/** Every webhook event id seen once: a replayed or duplicated event is recognised and changes nothing. */
export const stripeEvents = pgTable('stripe_events', {
  id: text().primaryKey(),
  type: text().notNull(),
  stripeCreatedAt: timestamp({ withTimezone: true }),
  receivedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  outcome: text(),
});

export type Invoice = typeof invoices.$inferSelect;
export type NewInvoice = typeof invoices.$inferInsert;
export type InvoiceLine = typeof invoiceLines.$inferSelect;
export type NewInvoiceLine = typeof invoiceLines.$inferInsert;
export type Payment = typeof payments.$inferSelect;
export type PaymentRefund = typeof paymentRefunds.$inferSelect;
export type CheckoutSession = typeof checkoutSessions.$inferSelect;
