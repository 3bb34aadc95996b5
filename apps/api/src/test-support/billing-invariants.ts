import { sql } from 'drizzle-orm';
import type { Executor } from '@hitchbook/db';

/**
 * What must hold for an operation's invoices whatever went wrong while they were issued: numbers per
 * series run 1…N, no work entry is on the lines of two invoices that count (issued, not void), and no
 * invoice is half issued (without a number, lines or locked entries).
 */
export interface BillingState {
  numbers: Record<string, number[]>;
  entriesOnTwoInvoices: string[];
  /** Issued invoices whose work-entry lines and entry locks disagree. */
  partlyIssued: string[];
  /** Drafts that hold an entry lock: a rolled-back or killed issue must release it. */
  lockedByDraft: string[];
}

export async function billingState(db: Executor, operationId: string): Promise<BillingState> {
  const numbered = await db.execute<{ series: string; number: number }>(
    sql`select series, number from invoices where operation_id = ${operationId} and number is not null order by series, number`,
  );
  const numbers: Record<string, number[]> = {};
  for (const r of numbered.rows) (numbers[r.series] ??= []).push(Number(r.number));
  const twice = await db.execute<{ work_entry_id: string }>(sql`
    select l.work_entry_id from invoice_lines l join invoices i on i.id = l.invoice_id
    where i.operation_id = ${operationId} and i.status = 'issued' and i.kind = 'invoice' and l.work_entry_id is not null
    group by l.work_entry_id having count(distinct i.id) > 1`);
  const partly = await db.execute<{ id: string }>(sql`
    select i.id from invoices i
    where i.operation_id = ${operationId} and i.status = 'issued' and i.kind = 'invoice'
      and (
        not exists (select 1 from invoice_lines l where l.invoice_id = i.id)
        or exists (
          select 1 from invoice_lines l where l.invoice_id = i.id and l.work_entry_id is not null
            and not exists (select 1 from invoice_entries e where e.work_entry_id = l.work_entry_id and e.invoice_id = i.id)
        )
      )`);
  const lockedByDraft = await db.execute<{ id: string }>(sql`
    select distinct i.id from invoice_entries e join invoices i on i.id = e.invoice_id
    where i.operation_id = ${operationId} and i.status = 'draft'`);
  return {
    numbers,
    entriesOnTwoInvoices: twice.rows.map((r) => r.work_entry_id),
    partlyIssued: partly.rows.map((r) => r.id),
    lockedByDraft: lockedByDraft.rows.map((r) => r.id),
  };
}

/** 1…n, the only numbering a series may have. */
export const contiguous = (n: number): number[] => Array.from({ length: n }, (_, i) => i + 1);
