import { Inject, Injectable } from '@nestjs/common';
import { and, asc, count, desc, eq, gte, inArray, isNotNull, lte, sql, type AnyColumn, type Placeholder, type SQL } from 'drizzle-orm';
import {
  fields,
  invoiceLines,
  invoices,
  operations,
  parties,
  payments,
  workEntries,
  workTypes,
  type Executor,
  type Invoice,
  type InvoiceLine,
  type NewInvoiceLine,
  type Operation,
  type Party,
  type Payment,
} from '@hitchbook/db';
import type { PgInsertValue, PgUpdateSetSource } from 'drizzle-orm/pg-core';
import type { InvoiceEntryDto, InvoiceKind, InvoiceState } from '@hitchbook/shared/schemas/invoices';
import { DB, type DbHandle } from '../../core/database.js';
import { statementName } from '../../core/prepared.js';
import type { InvoiceScope } from '../customer-portal/invoice-scope.js';

const shownLineColumns = {
  id: invoiceLines.id,
  position: invoiceLines.position,
  kind: invoiceLines.kind,
  workEntryId: invoiceLines.workEntryId,
  workDate: invoiceLines.workDate,
  description: invoiceLines.description,
  fieldName: invoiceLines.fieldName,
  workTypeName: invoiceLines.workTypeName,
  quantity: invoiceLines.quantity,
  unit: invoiceLines.unit,
  rate: invoiceLines.rate,
  amount: invoiceLines.amount,
};
export type ShownLine = Pick<InvoiceLine, keyof typeof shownLineColumns>;

/** What a customer may see of a billed entry: where, when, what and how much, nothing about machines or costs. */
const entryColumns = {
  id: workEntries.id,
  workDate: workEntries.workDate,
  fieldName: fields.name,
  workTypeName: workTypes.name,
  hours: workEntries.hours,
  acres: workEntries.acres,
  miles: workEntries.miles,
  loads: workEntries.loads,
  eachCount: workEntries.eachCount,
} satisfies Record<keyof InvoiceEntryDto, unknown>;

/**
 * A select list naming each column as the answer does, for reads whose driver rows are the answer as they come:
 * an invoice of 500 entries is 6,000 cells, and the ORM's mapping of them one by one took more of its page's time
 * than the database did. Numeric and date columns come as text, as through the ORM.
 */
function aliased(columns: Record<string, AnyColumn>): SQL {
  return sql.join(
    Object.entries(columns).map(([name, column]) => sql`${column} as ${sql.identifier(name)}`),
    sql`, `,
  );
}

export interface DraftCounts {
  lines: number;
  billed: number;
  held: number;
}

export interface InvoiceSummaryRow {
  invoice: Invoice;
  partyName: string;
  /** Issued credit notes against the invoice, positive. */
  credited: string;
  balance: string;
  state: InvoiceState;
}

export interface InvoiceListFilter {
  partyId?: string;
  states?: InvoiceState[];
  kind?: InvoiceKind;
  from?: string;
  to?: string;
  sort: string;
  limit: number;
  offset: number;
}

/*
 * The standing of an invoice, computed in one place from payments, credit notes and dates so the list
 * filter and the detail can never disagree. Credit notes carry negative totals.
 */
const creditedSql = sql<string>`coalesce((select -sum(cn.total) from invoices cn
  where cn.operation_id = ${invoices.operationId} and cn.credit_of_invoice_id = ${invoices.id} and cn.status = 'issued'), 0)::numeric(14,2)`;
const balanceSql = sql<string>`(case when ${invoices.kind} = 'invoice' and ${invoices.status} = 'issued'
  then ${invoices.total} - ${invoices.amountPaid} - ${creditedSql} else 0 end)::numeric(14,2)`;
const stateSql = sql<InvoiceState>`case
  when ${invoices.status} = 'draft' then 'draft'
  when ${invoices.status} = 'void' then 'void'
  when ${invoices.kind} = 'credit-note' then 'issued'
  when ${balanceSql} <= 0 then 'paid'
  when ${invoices.dueDate} < current_date then 'overdue'
  when ${invoices.amountPaid} > 0 or ${creditedSql} > 0 then 'partly-paid'
  else 'issued' end`;

const summaryColumns = { invoice: invoices, partyName: parties.name, credited: creditedSql, balance: balanceSql, state: stateSql };

// A list row carries what the table shows, not the printed snapshots and notes of each document.
const listedInvoiceColumns = {
  id: invoices.id,
  kind: invoices.kind,
  series: invoices.series,
  number: invoices.number,
  partyId: invoices.partyId,
  status: invoices.status,
  periodFrom: invoices.periodFrom,
  periodTo: invoices.periodTo,
  issueDate: invoices.issueDate,
  dueDate: invoices.dueDate,
  termsDays: invoices.termsDays,
  subtotal: invoices.subtotal,
  total: invoices.total,
  amountPaid: invoices.amountPaid,
  creditOfInvoiceId: invoices.creditOfInvoiceId,
  sentAt: invoices.sentAt,
  version: invoices.version,
  createdAt: invoices.createdAt,
};
export type ListedInvoice = Pick<Invoice, keyof typeof listedInvoiceColumns>;
export type InvoiceListRow = Omit<InvoiceSummaryRow, 'invoice'> & { invoice: ListedInvoice };

const dateOf = sql`coalesce(${invoices.issueDate}, (${invoices.createdAt})::date)`;
const SORTS: Record<string, SQL[]> = {
  issueDate: [asc(dateOf)],
  '-issueDate': [desc(dateOf)],
  dueDate: [asc(invoices.dueDate)],
  '-dueDate': [desc(invoices.dueDate)],
  number: [asc(invoices.series), asc(invoices.number)],
  '-number': [desc(invoices.series), desc(invoices.number)],
  total: [asc(invoices.total)],
  '-total': [desc(invoices.total)],
  createdAt: [asc(invoices.createdAt)],
  '-createdAt': [desc(invoices.createdAt)],
};

/** The scope's conditions; its ids may be placeholders, for a statement prepared for every caller of that kind. */
function scopeWhere(scope: { operationId: string | Placeholder; partyId: string | Placeholder | null; issuedOnly: boolean }): SQL | undefined {
  return and(
    eq(invoices.operationId, scope.operationId),
    scope.partyId ? eq(invoices.partyId, scope.partyId) : undefined,
    scope.issuedOnly ? isNotNull(invoices.number) : undefined,
  );
}

/** Invoice rows, lines and payments; reads take a scope (operation, and party for customers). */
@Injectable()
export class InvoicesRepository {
  constructor(@Inject(DB) private readonly dbh: DbHandle) {}

  /**
   * A page of invoices and their count. The statements are built once for each combination of scope,
   * filters and sort, with placeholders for the values, and prepared: planning the standing's
   * subqueries cost more than running them on a page.
   */
  async summaries(scope: InvoiceScope, filter: InvoiceListFilter): Promise<{ rows: InvoiceListRow[]; total: number }> {
    const given = {
      operationId: scope.operationId,
      scopePartyId: scope.partyId ?? undefined,
      partyId: filter.partyId,
      kind: filter.kind,
      states: filter.states,
      from: filter.from,
      to: filter.to,
    };
    const values = Object.fromEntries(Object.entries(given).filter(([, v]) => v !== undefined));
    const shape = `${filter.sort}:${scope.issuedOnly}:${Object.keys(values).join(',')}`;
    let statements = this.summaryStatements.get(shape);
    if (!statements) {
      statements = this.prepareSummaries(new Set(Object.keys(values)), scope.issuedOnly, filter.sort);
      this.summaryStatements.set(shape, statements);
    }
    const [rows, totals] = await Promise.all([statements.page.execute({ ...values, limit: filter.limit, offset: filter.offset }), statements.count.execute(values)]);
    return { rows, total: totals[0]?.n ?? 0 };
  }

  private readonly summaryStatements = new Map<string, ReturnType<InvoicesRepository['prepareSummaries']>>();

  /** The list's statements for the values named in `given`, each a placeholder of its name. */
  private prepareSummaries(given: Set<string>, issuedOnly: boolean, sort: string) {
    const value = (name: string) => sql.placeholder(name);
    const where = and(
      scopeWhere({ operationId: value('operationId'), partyId: given.has('scopePartyId') ? value('scopePartyId') : null, issuedOnly }),
      given.has('partyId') ? eq(invoices.partyId, value('partyId')) : undefined,
      given.has('kind') ? eq(invoices.kind, value('kind')) : undefined,
      given.has('states') ? sql`${stateSql} = any(${value('states')}::text[])` : undefined,
      given.has('from') ? gte(dateOf, value('from')) : undefined,
      given.has('to') ? lte(dateOf, value('to')) : undefined,
    );
    const page = this.dbh.db
      .select({ ...summaryColumns, invoice: listedInvoiceColumns })
      .from(invoices)
      .innerJoin(parties, and(eq(parties.operationId, invoices.operationId), eq(parties.id, invoices.partyId)))
      .where(where)
      .orderBy(...(SORTS[sort] ?? SORTS['-createdAt']!), asc(invoices.id))
      .limit(value('limit'))
      .offset(value('offset'));
    const total = this.dbh.db.select({ n: count() }).from(invoices).where(where);
    return { page: page.prepare(statementName(page.toSQL().sql)), count: total.prepare(statementName(total.toSQL().sql)) };
  }

  async summary(scope: InvoiceScope, id: string, executor: Executor = this.dbh.db): Promise<InvoiceSummaryRow | undefined> {
    const [row] = await executor
      .select(summaryColumns)
      .from(invoices)
      .innerJoin(parties, and(eq(parties.operationId, invoices.operationId), eq(parties.id, invoices.partyId)))
      .where(and(scopeWhere(scope), eq(invoices.id, id)));
    return row;
  }

  /** Locks the invoice row for the rest of the transaction: writers to one invoice take turns. */
  async lock(operationId: string, id: string, tx: Executor): Promise<Invoice | undefined> {
    const [row] = await tx
      .select()
      .from(invoices)
      .where(and(eq(invoices.operationId, operationId), eq(invoices.id, id)))
      .for('update');
    return row;
  }

  async lines(operationId: string, invoiceId: string, executor: Executor = this.dbh.db): Promise<InvoiceLine[]> {
    return executor
      .select()
      .from(invoiceLines)
      .where(and(eq(invoiceLines.operationId, operationId), eq(invoiceLines.invoiceId, invoiceId)))
      .orderBy(asc(invoiceLines.position));
  }

  /** The lines as the invoice shows them: without the pricing details kept for credit notes and audits. */
  async shownLines(operationId: string, invoiceId: string, executor: Executor = this.dbh.db): Promise<ShownLine[]> {
    const l = invoiceLines;
    const result = await executor.execute<ShownLine & Record<string, unknown>>(sql`
      select ${aliased(shownLineColumns)}
      from ${l}
      where ${l.operationId} = ${operationId} and ${l.invoiceId} = ${invoiceId}
      order by ${l.position}`);
    return result.rows;
  }

  async creditNotesOf(operationId: string, invoiceId: string, executor: Executor = this.dbh.db): Promise<Invoice[]> {
    return executor
      .select()
      .from(invoices)
      .where(and(eq(invoices.operationId, operationId), eq(invoices.creditOfInvoiceId, invoiceId)))
      .orderBy(asc(invoices.number));
  }

  async find(operationId: string, id: string, executor: Executor = this.dbh.db): Promise<Invoice | undefined> {
    const [row] = await executor.select().from(invoices).where(and(eq(invoices.operationId, operationId), eq(invoices.id, id)));
    return row;
  }

  /** The billed entries as a customer may see them (entryColumns). */
  async entries(operationId: string, ids: string[], executor: Executor = this.dbh.db): Promise<InvoiceEntryDto[]> {
    if (ids.length === 0) return [];
    // By an array of ids, not a subquery on the lines: the planner then knows how many rows come, where for a
    // new invoice its statistics on the lines would say a handful and pick loops that take ten times as long.
    const w = workEntries;
    const result = await executor.execute<InvoiceEntryDto & Record<string, unknown>>(sql`
      select ${aliased(entryColumns)}
      from ${w}
      join ${fields} on ${fields.operationId} = ${w.operationId} and ${fields.id} = ${w.fieldId}
      join ${workTypes} on ${workTypes.operationId} = ${w.operationId} and ${workTypes.id} = ${w.workTypeId}
      where ${w.operationId} = ${operationId} and ${w.id} = any(${sql.param(ids)}::uuid[])
      order by ${w.workDate}, ${fields.name}, ${w.id}`);
    return result.rows;
  }

  async insert(values: PgInsertValue<typeof invoices>, tx: Executor): Promise<Invoice> {
    const [row] = await tx.insert(invoices).values(values).returning();
    return row!;
  }

  async update(operationId: string, id: string, values: PgUpdateSetSource<typeof invoices>, tx: Executor): Promise<Invoice> {
    const [row] = await tx
      .update(invoices)
      .set({ ...values, updatedAt: new Date() })
      .where(and(eq(invoices.operationId, operationId), eq(invoices.id, id)))
      .returning();
    return row!;
  }

  async remove(operationId: string, id: string, tx: Executor): Promise<void> {
    await tx.delete(invoices).where(and(eq(invoices.operationId, operationId), eq(invoices.id, id)));
  }

  /**
   * All lines travel as one JSON parameter: a parameter per column and line costs more to build than the
   * insert itself. Decimals stay strings in the JSON and are read by numeric's own input, exactly.
   */
  async insertLines(operationId: string, invoiceId: string, lines: Array<Omit<NewInvoiceLine, 'operationId' | 'invoiceId' | 'id'>>, tx: Executor): Promise<void> {
    if (lines.length === 0) return;
    const rows = lines.map((l) => ({
      position: l.position,
      kind: l.kind,
      work_entry_id: l.workEntryId ?? null,
      work_date: l.workDate ?? null,
      description: l.description,
      field_name: l.fieldName ?? null,
      work_type_name: l.workTypeName ?? null,
      quantity: l.quantity ?? null,
      unit: l.unit ?? null,
      rate: l.rate ?? null,
      amount: l.amount,
      details: l.details ?? null,
    }));
    await tx.execute(sql`
      insert into invoice_lines (operation_id, invoice_id, position, kind, work_entry_id, work_date, description, field_name, work_type_name, quantity, unit, rate, amount, details)
      select ${operationId}, ${invoiceId}, l.position, l.kind, l.work_entry_id, l.work_date, l.description, l.field_name, l.work_type_name, l.quantity, l.unit, l.rate, l.amount, l.details
      from jsonb_to_recordset(${JSON.stringify(rows)}::jsonb) as l(position int, kind text, work_entry_id uuid, work_date date, description text, field_name text,
        work_type_name text, quantity numeric, unit text, rate numeric, amount numeric, details jsonb)`);
  }

  async deleteLines(operationId: string, invoiceId: string, kinds: InvoiceLine['kind'][], tx: Executor): Promise<void> {
    await tx.delete(invoiceLines).where(and(eq(invoiceLines.operationId, operationId), eq(invoiceLines.invoiceId, invoiceId), inArray(invoiceLines.kind, kinds)));
  }

  /** What issuing checks, in one round trip: the draft's lines, the entries they bill, and the entries it holds. */
  async draftCounts(operationId: string, invoiceId: string, tx: Executor): Promise<DraftCounts> {
    const result = await tx.execute<DraftCounts & Record<string, unknown>>(sql`
      select
        (select count(*)::int from invoice_lines where operation_id = ${operationId} and invoice_id = ${invoiceId}) as lines,
        (select count(distinct work_entry_id)::int from invoice_lines where operation_id = ${operationId} and invoice_id = ${invoiceId}) as billed,
        (select count(*)::int from invoice_entries where operation_id = ${operationId} and invoice_id = ${invoiceId}) as held`);
    return result.rows[0]!;
  }

  async party(operationId: string, partyId: string, executor: Executor = this.dbh.db): Promise<Party | undefined> {
    const [row] = await executor.select().from(parties).where(and(eq(parties.operationId, operationId), eq(parties.id, partyId)));
    return row;
  }

  async operation(operationId: string, executor: Executor = this.dbh.db): Promise<Operation> {
    const [row] = await executor.select().from(operations).where(eq(operations.id, operationId));
    return row!;
  }

  async payments(operationId: string, invoiceId: string, executor: Executor = this.dbh.db): Promise<Payment[]> {
    return executor
      .select()
      .from(payments)
      .where(and(eq(payments.operationId, operationId), eq(payments.invoiceId, invoiceId)))
      .orderBy(asc(payments.receivedOn), asc(payments.createdAt));
  }

  async payment(operationId: string, paymentId: string, executor: Executor = this.dbh.db): Promise<Payment | undefined> {
    const [row] = await executor.select().from(payments).where(and(eq(payments.operationId, operationId), eq(payments.id, paymentId)));
    return row;
  }
}
