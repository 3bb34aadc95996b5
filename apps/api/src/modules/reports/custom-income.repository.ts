import { Inject, Injectable } from '@nestjs/common';
import { sql } from 'drizzle-orm';
import type { Executor } from '@hitchbook/db';
import { DB, type DbHandle } from '../../core/database.js';
import { COUNTED_STATES, machineUseRows, type YearBounds } from '@hitchbook/db/square-up-sums';

export type IncomeByCustomer = {
  partyId: string;
  name: string;
  relationship: 'family' | 'neighbour' | 'agency';
  amount: string;
  invoices: number;
};

export type IncomeByLine = {
  kind: string;
  workTypeName: string | null;
  unit: string | null;
  quantity: string | null;
  amount: string;
  lines: number;
};

export type FieldWork = {
  fieldId: string;
  name: string;
  kind: 'field' | 'roadside';
  acres: string;
  hours: string;
  acresWorked: string;
};

/** Issued invoices and credit notes (stored negative) count by their issue date; void ones never. */
const ISSUED_IN_YEAR = (operationId: string, bounds: YearBounds) => sql`
  i.operation_id = ${operationId} and i.status = 'issued' and i.issue_date between ${bounds.from} and ${bounds.to}`;

@Injectable()
export class CustomIncomeRepository {
  constructor(@Inject(DB) private readonly dbh: DbHandle) {}

  async byCustomer(operationId: string, bounds: YearBounds, executor: Executor = this.dbh.db): Promise<IncomeByCustomer[]> {
    const result = await executor.execute<IncomeByCustomer>(sql`
      select i.party_id as "partyId", p.name, p.relationship, sum(il.amount)::text as amount,
             count(distinct i.id) filter (where i.kind = 'invoice')::int as invoices
      from invoices i
      join invoice_lines il on il.operation_id = i.operation_id and il.invoice_id = i.id
      join parties p on p.operation_id = i.operation_id and p.id = i.party_id
      where ${ISSUED_IN_YEAR(operationId, bounds)}
      group by i.party_id, p.name, p.relationship
      order by sum(il.amount) desc, p.name`);
    return result.rows;
  }

  async byLine(operationId: string, bounds: YearBounds, executor: Executor = this.dbh.db): Promise<IncomeByLine[]> {
    const result = await executor.execute<IncomeByLine>(sql`
      select il.kind, il.work_type_name as "workTypeName", il.unit,
             case when il.kind = 'work' then sum(il.quantity)::text end as quantity,
             sum(il.amount)::text as amount, count(*)::int as lines
      from invoices i
      join invoice_lines il on il.operation_id = i.operation_id and il.invoice_id = i.id
      where ${ISSUED_IN_YEAR(operationId, bounds)}
      group by il.kind, il.work_type_name, il.unit
      order by sum(il.amount) desc`);
    return result.rows;
  }

  /** Each field's counted hours and acres worked in the year (each entry once, whatever machines it used). */
  async fieldWork(operationId: string, bounds: YearBounds, executor: Executor = this.dbh.db): Promise<FieldWork[]> {
    const result = await executor.execute<FieldWork>(sql`
      select f.id as "fieldId", f.name, f.kind, f.acres::text as acres, sum(we.hours)::text as hours, coalesce(sum(we.acres), 0)::text as "acresWorked"
      from work_entries we
      join fields f on f.operation_id = we.operation_id and f.id = we.field_id
      where we.operation_id = ${operationId} and we.work_date between ${bounds.from} and ${bounds.to} and we.state in ${COUNTED_STATES}
      group by f.id, f.name, f.kind, f.acres
      order by f.name, f.id`);
    return result.rows;
  }

  /** Each machine's hours on each field: the weights its year's costs are spread by. */
  async machineFieldHours(operationId: string, bounds: YearBounds, executor: Executor = this.dbh.db): Promise<Array<{ machineId: string; fieldId: string; hours: string }>> {
    const result = await executor.execute<{ machineId: string; fieldId: string; hours: string }>(sql`
      select u.machine_id as "machineId", u.field_id as "fieldId", sum(u.hours)::text as hours
      from (${machineUseRows(operationId, bounds, COUNTED_STATES)}) u
      group by u.machine_id, u.field_id
      order by u.machine_id, u.field_id`);
    return result.rows;
  }
}
