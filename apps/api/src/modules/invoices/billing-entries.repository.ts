import { Inject, Injectable } from '@nestjs/common';
import { and, asc, eq, gte, lte, notExists, sql } from 'drizzle-orm';
import { fields, invoiceEntries, workEntries, workTypes, type Executor } from '@hitchbook/db';
import { DB, type DbHandle } from '../../core/database.js';
import type { EntryToBill } from './draft-pricing.js';

/**
 * The work entries side of billing: which entries can be billed, and holding them for an invoice. A draft
 * holds its entries from the moment it is made (state invoiced, one invoice_entries row each), so issuing
 * writes nothing per entry; deleting the draft or voiding the invoice lets them go.
 */
@Injectable()
export class BillingEntriesRepository {
  constructor(@Inject(DB) private readonly dbh: DbHandle) {}

  /** Approved entries for the party in the date range that no invoice, draft or issued, holds. */
  async unbilled(operationId: string, partyId: string, from: string, to: string, executor: Executor = this.dbh.db): Promise<EntryToBill[]> {
    return executor
      .select({
        id: workEntries.id,
        version: workEntries.version,
        workDate: workEntries.workDate,
        workTypeId: workEntries.workTypeId,
        workTypeName: workTypes.name,
        defaultUnit: workTypes.defaultUnit,
        fieldName: fields.name,
        hours: workEntries.hours,
        acres: workEntries.acres,
        miles: workEntries.miles,
        loads: workEntries.loads,
        eachCount: workEntries.eachCount,
      })
      .from(workEntries)
      .innerJoin(fields, and(eq(fields.operationId, workEntries.operationId), eq(fields.id, workEntries.fieldId)))
      .innerJoin(workTypes, and(eq(workTypes.operationId, workEntries.operationId), eq(workTypes.id, workEntries.workTypeId)))
      .where(
        and(
          eq(workEntries.operationId, operationId),
          eq(workEntries.billToPartyId, partyId),
          eq(workEntries.state, 'approved'),
          gte(workEntries.workDate, from),
          lte(workEntries.workDate, to),
          notExists(executor.select({ one: sql`1` }).from(invoiceEntries).where(eq(invoiceEntries.workEntryId, workEntries.id))),
        ),
      )
      .orderBy(asc(workEntries.workDate), asc(fields.name));
  }

  /** The rows whose primary key makes a second bill for the same entry impossible; a clash throws 23505. */
  async claim(operationId: string, invoiceId: string, entryIds: string[], tx: Executor): Promise<void> {
    if (entryIds.length === 0) return;
    // The ids travel as one array parameter: building a row of parameters per entry costs more than the insert.
    await tx.execute(sql`
      insert into invoice_entries (work_entry_id, operation_id, invoice_id)
      select billed.id, ${operationId}, ${invoiceId} from unnest(${sql.param(entryIds)}::uuid[]) as billed(id)`);
  }

  /**
   * Moves the entries to invoiced, only those still approved for this party at the version the draft priced,
   * and answers the ids moved. An answer shorter than `entries` means some changed while the draft was priced:
   * the caller must roll back. One statement whatever the number of entries: ids and versions travel as two arrays.
   */
  async markInvoiced(operationId: string, partyId: string, entries: Array<{ id: string; version: number }>, tx: Executor): Promise<string[]> {
    if (entries.length === 0) return [];
    // The party is checked on the moved rows, not in the update's filter: there the planner would read all of
    // the party's approved entries through its index rather than the few by id.
    const result = await tx.execute<{ id: string; bill_to_party_id: string }>(sql`
      with moved as (
        update work_entries we
        set state = 'invoiced', version = we.version + 1, updated_at = now()
        from unnest(${sql.param(entries.map((e) => e.id))}::uuid[], ${sql.param(entries.map((e) => e.version))}::int[]) as priced(id, version)
        where we.operation_id = ${operationId} and we.id = priced.id and we.state = 'approved' and we.version = priced.version
        returning we.id, we.bill_to_party_id)
      select id from moved where bill_to_party_id = ${partyId}`);
    return result.rows.map((r) => r.id);
  }

  /**
   * Work lines of the invoice whose entry it does not hold. None for any draft made since drafts hold their
   * entries; issuing refuses a draft that has some rather than bill an entry nothing protects.
   */
  async unheldLines(operationId: string, invoiceId: string, tx: Executor): Promise<Array<{ workDate: string | null; fieldName: string | null }>> {
    const result = await tx.execute<{ workDate: string | null; fieldName: string | null }>(sql`
      select distinct l.work_date::text as "workDate", l.field_name as "fieldName"
      from invoice_lines l
      where l.operation_id = ${operationId} and l.invoice_id = ${invoiceId} and l.work_entry_id is not null
        and not exists (select 1 from invoice_entries ie where ie.work_entry_id = l.work_entry_id and ie.invoice_id = ${invoiceId})
      order by 1, 2`);
    return result.rows;
  }

  /** Deleting a draft or voiding an invoice: it lets go of its entries, which are approved and billable again. */
  async release(operationId: string, invoiceId: string, tx: Executor): Promise<string[]> {
    const released = await tx
      .delete(invoiceEntries)
      .where(and(eq(invoiceEntries.operationId, operationId), eq(invoiceEntries.invoiceId, invoiceId)))
      .returning({ id: invoiceEntries.workEntryId });
    const ids = released.map((r) => r.id);
    if (ids.length > 0) {
      await tx
        .update(workEntries)
        .set({ state: 'approved', version: sql`${workEntries.version} + 1`, updatedAt: new Date() })
        .where(and(eq(workEntries.operationId, operationId), sql`${workEntries.id} = any(${sql.param(ids)}::uuid[])`, eq(workEntries.state, 'invoiced')));
    }
    return ids;
  }
}
