import { Inject, Injectable } from '@nestjs/common';
import { sql } from 'drizzle-orm';
import { DB, type DbHandle } from '../../core/database.js';

// The home page's sums: one grouped query each, scoped by the operation id passed first.

type Row<T> = T & Record<string, unknown>;

export type UnbilledByCustomer = {
  partyId: string;
  name: string;
  entries: number;
  /** At the sheet rate in force for the party on each work date, before minimums, travel and fuel adjustment. */
  estimate: string;
  /** Entries no sheet line prices in the work type's default unit. */
  unpriced: number;
};

export type RefundDue = { invoiceId: string; series: string; number: number | null; left: string };

@Injectable()
export class DashboardRepository {
  constructor(@Inject(DB) private readonly dbh: DbHandle) {}

  async entryCounts(operationId: string, operatorUserId: string | null): Promise<Record<'draft' | 'submitted', number>> {
    const result = await this.dbh.db.execute<Row<{ state: 'draft' | 'submitted'; n: number }>>(sql`
      select state, count(*)::int as n from work_entries
      where operation_id = ${operationId} and state in ('draft', 'submitted')
        ${operatorUserId === null ? sql`` : sql`and operator_user_id = ${operatorUserId}`}
      group by state`);
    const counts = { draft: 0, submitted: 0 };
    for (const row of result.rows) counts[row.state] = row.n;
    return counts;
  }

  /** Approved work billed to customers and on no issued invoice, with a sheet-rate estimate of its worth. */
  async unbilledByCustomer(operationId: string): Promise<UnbilledByCustomer[]> {
    const result = await this.dbh.db.execute<Row<UnbilledByCustomer>>(sql`
      select p.id as "partyId", p.name, count(*)::int as entries,
             coalesce(sum(l.rate * case wt.default_unit when 'acre' then we.acres when 'hour' then we.hours when 'mile' then we.miles
                                     when 'load' then we.loads else we.each_count end), 0)::numeric(14,2)::text as estimate,
             count(*) filter (where l.rate is null)::int as unpriced
      from work_entries we
      join parties p on p.operation_id = we.operation_id and p.id = we.bill_to_party_id and p.kind = 'customer'
      join work_types wt on wt.operation_id = we.operation_id and wt.id = we.work_type_id
      left join lateral (
        select rs.id from rate_sheets rs
        where rs.operation_id = we.operation_id and rs.archived_at is null and rs.effective_from <= we.work_date
          and (rs.party_id = p.id or (rs.party_id is null and rs.relationship = p.relationship))
        order by (rs.party_id is not null) desc, rs.effective_from desc
        limit 1
      ) sheet on true
      left join rate_sheet_lines l on l.operation_id = we.operation_id and l.rate_sheet_id = sheet.id and l.work_type_id = we.work_type_id
        and l.unit = wt.default_unit and l.charge_type = 'custom'
      where we.operation_id = ${operationId} and we.state = 'approved'
        and not exists (select 1 from invoice_entries ie where ie.work_entry_id = we.id)
      group by p.id, p.name
      order by sum(we.hours) desc, p.name`);
    return result.rows;
  }

  /** Power units that worked since the day but have no meter reading since it. */
  async machinesDueForReading(operationId: string, since: string): Promise<Array<{ id: string; name: string }>> {
    const result = await this.dbh.db.execute<Row<{ id: string; name: string }>>(sql`
      select m.id, m.name from machines m
      where m.operation_id = ${operationId} and m.status = 'active' and m.kind <> 'implement'
        and exists (select 1 from work_entries we where we.operation_id = ${operationId} and we.power_machine_id = m.id and we.work_date >= ${since})
        and not exists (select 1 from meter_readings r where r.operation_id = ${operationId} and r.machine_id = m.id and r.read_at >= ${since}::date)
      order by m.name, m.id`);
    return result.rows;
  }

  /** Hours logged per week (weeks start on Monday) from a Monday on, optionally by one operator. */
  async hoursPerWeek(operationId: string, fromMonday: string, operatorUserId: string | null): Promise<Map<string, string>> {
    const result = await this.dbh.db.execute<Row<{ week: string; hours: string }>>(sql`
      select date_trunc('week', work_date)::date::text as week, sum(hours)::text as hours
      from work_entries
      where operation_id = ${operationId} and work_date >= ${fromMonday}
        ${operatorUserId === null ? sql`and state <> 'draft'` : sql`and operator_user_id = ${operatorUserId}`}
      group by 1`);
    return new Map(result.rows.map((row) => [row.week, row.hours]));
  }

  /** Card money that reached a void or already paid invoice and has not all gone back yet. */
  async refundsDue(operationId: string): Promise<RefundDue[]> {
    const result = await this.dbh.db.execute<Row<RefundDue>>(sql`
      select i.id as "invoiceId", i.series, i.number, (p.amount - p.amount_refunded)::numeric(14,2)::text as "left"
      from payments p join invoices i on i.operation_id = p.operation_id and i.id = p.invoice_id
      where p.operation_id = ${operationId} and p.refund_due is not null and p.amount > p.amount_refunded
      order by p.received_on, p.created_at`);
    return result.rows;
  }
}
