import { sql } from 'drizzle-orm';
import { invoiceCounters, type Executor } from '@hitchbook/db';

/** Invoices and credit notes are numbered in their own series: INV-0001…, CN-0001…. */
export const SERIES = { invoice: 'INV', 'credit-note': 'CN' } as const;

export function numberLabel(series: string, number: number | null): string | null {
  return number === null ? null : `${series}-${String(number).padStart(4, '0')}`;
}

/**
 * Takes the next number of the series inside the caller's transaction, in one statement. The upsert
 * leaves the counter row locked until that transaction ends, so issuers take turns, and a rollback gives
 * the number back: the committed numbers run 1, 2, 3… without a gap (a sequence would lose numbers on abort).
 */
export async function takeNextNumber(tx: Executor, operationId: string, series: string): Promise<number> {
  const [counter] = await tx
    .insert(invoiceCounters)
    .values({ operationId, series, nextNumber: 2 })
    .onConflictDoUpdate({ target: [invoiceCounters.operationId, invoiceCounters.series], set: { nextNumber: sql`${invoiceCounters.nextNumber} + 1` } })
    .returning({ next: invoiceCounters.nextNumber });
  return counter!.next - 1;
}
