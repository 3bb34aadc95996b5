import { sql } from 'drizzle-orm';
import type { Executor } from '@hitchbook/db';

/**
 * What must hold for an operation's invoices whatever went wrong while they were issued: numbers per
 * series run 1…N, no work entry is on the lines of two invoices that count (issued, not void), no
 * invoice is half issued (without a number, lines or held entries), and every draft holds the entries it bills.
 */
export interface BillingState {
  numbers: Record<string, number[]>;
  entriesOnTwoInvoices: string[];
  /** Issued invoices whose work-entry lines and entry holds disagree. */
  partlyIssued: string[];
  /** Drafts with a work line whose entry they do not hold: a rolled-back or killed issue must leave the holds as they were. */
  draftsMissingEntries: string[];
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
  const draftsMissingEntries = await db.execute<{ id: string }>(sql`
    select distinct i.id from invoices i join invoice_lines l on l.invoice_id = i.id and l.work_entry_id is not null
    where i.operation_id = ${operationId} and i.status = 'draft'
      and not exists (select 1 from invoice_entries e where e.work_entry_id = l.work_entry_id and e.invoice_id = i.id)`);
  return {
    numbers,
    entriesOnTwoInvoices: twice.rows.map((r) => r.work_entry_id),
    partlyIssued: partly.rows.map((r) => r.id),
    draftsMissingEntries: draftsMissingEntries.rows.map((r) => r.id),
  };
}

/** 1…n, the only numbering a series may have. */
export const contiguous = (n: number): number[] => Array.from({ length: n }, (_, i) => i + 1);
