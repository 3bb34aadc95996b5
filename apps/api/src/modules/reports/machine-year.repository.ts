import { Inject, Injectable } from '@nestjs/common';
import { sql } from 'drizzle-orm';
import type { Executor } from '@hitchbook/db';
import { executePrepared } from '@hitchbook/db/prepared';
import {
  machineCostSums,
  machineUseRows,
  machineUseSums,
  yearBounds,
  type CostSums,
  type MachineUseSums,
  type YearBounds,
} from '@hitchbook/db/square-up-sums';
import { DB, type DbHandle } from '../../core/database.js';

// A machine's year in sums: every query is scoped by the operation id and bounded by the year, reading
// the kept sums of work (machine_work_type_years) or that year's rows through the date indexes, never
// the other years'.

export type MachineRow = {
  id: string;
  name: string;
  classId: string;
  kind: 'power' | 'self-propelled' | 'implement';
  status: 'active' | 'sold' | 'retired';
  modelYear: number | null;
  ptoHp: string | null;
  fuelType: 'diesel' | 'gasoline' | 'lpg' | null;
  listPrice: string | null;
  purchasePrice: string | null;
  purchaseDate: string | null;
  hoursAtPurchase: string;
  plannedYearsOwned: number | null;
  plannedHoursPerYear: string | null;
  repairFactor1: string | null;
  repairFactor2: string | null;
};

export type FuelPriceSums = {
  /** null: every machine together. */
  machineId: string | null;
  amount: string;
  gallons: string;
};

export type FamilySheet = {
  id: string;
  name: string;
  operatorWage: string;
  laborFactor: string;
};

@Injectable()
export class MachineYearRepository {
  constructor(@Inject(DB) private readonly dbh: DbHandle) {}

  async machines(operationId: string, executor: Executor = this.dbh.db): Promise<MachineRow[]> {
    const result = await executePrepared<MachineRow>(executor, sql`
      select id, name, class_id as "classId", kind, status, year as "modelYear", pto_hp::text as "ptoHp", fuel_type as "fuelType",
             list_price::text as "listPrice", purchase_price::text as "purchasePrice", purchase_date::text as "purchaseDate",
             hours_at_purchase::text as "hoursAtPurchase", planned_years_owned as "plannedYearsOwned",
             planned_hours_per_year::text as "plannedHoursPerYear", repair_factor1::text as "repairFactor1", repair_factor2::text as "repairFactor2"
      from machines
      where operation_id = ${operationId}
      order by name, id`);
    return result.rows;
  }

  async useSums(operationId: string, year: number, executor: Executor = this.dbh.db): Promise<MachineUseSums[]> {
    return machineUseSums(executor, operationId, year);
  }

  async costSums(operationId: string, year: number, executor: Executor = this.dbh.db): Promise<CostSums[]> {
    return machineCostSums(executor, operationId, year);
  }

  /** What fuel cost per gallon this year, from tickets that recorded gallons: per machine and for the fleet. */
  async fuelPrices(operationId: string, year: number, executor: Executor = this.dbh.db): Promise<FuelPriceSums[]> {
    const bounds = yearBounds(year);
    const result = await executePrepared<FuelPriceSums>(executor, sql`
      select machine_id as "machineId", sum(amount)::text as amount, sum(gallons)::text as gallons
      from cost_entries
      where operation_id = ${operationId} and category = 'fuel' and gallons > 0 and incurred_on between ${bounds.from} and ${bounds.to}
      group by rollup (machine_id)
      having sum(gallons) > 0`);
    return result.rows;
  }

  /** The family sheet (for everyone, not a party override) in force on a day. */
  async familySheetOn(operationId: string, day: string, executor: Executor = this.dbh.db): Promise<FamilySheet | null> {
    const result = await executePrepared<FamilySheet>(executor, sql`
      select id, name, operator_wage::text as "operatorWage", labor_factor::text as "laborFactor"
      from rate_sheets
      where operation_id = ${operationId} and relationship = 'family' and party_id is null and archived_at is null and effective_from <= ${day}
      order by effective_from desc, created_at desc
      limit 1`);
    return result.rows[0] ?? null;
  }

  /**
   * What issued (not void) invoices charged for the machine's work of the year, with that work's acres and hours.
   * A billed line carries its entry's date, so the year's lines are read by date and joined to the year's
   * entries in one pass, rather than looked up entry by entry.
   */
  async invoicedWork(operationId: string, bounds: YearBounds, executor: Executor = this.dbh.db): Promise<Array<{ machineId: string; revenue: string; acres: string; hours: string }>> {
    const result = await executePrepared<{ machineId: string; revenue: string; acres: string; hours: string }>(executor, sql`
      select u.machine_id as "machineId", sum(b.amount)::text as revenue, coalesce(sum(u.acres), 0)::text as acres, sum(u.hours)::text as hours
      from (${machineUseRows(operationId, bounds, sql`('invoiced')`)}) u
      join (
        select il.work_entry_id, sum(il.amount) as amount
        from invoice_lines il
        join invoices i on i.operation_id = il.operation_id and i.id = il.invoice_id
        where il.operation_id = ${operationId} and il.kind = 'work' and il.work_date between ${bounds.from} and ${bounds.to}
          and i.status = 'issued' and i.kind = 'invoice'
        group by il.work_entry_id
      ) b on b.work_entry_id = u.work_entry_id
      group by u.machine_id`);
    return result.rows;
  }

  /**
   * The neighbour sheet's custom per-acre rates for the work types each machine did this year, weighted
   * by the machine's acres of each: what the work would have been billed at.
   */
  async sheetAcreRates(operationId: string, year: number, executor: Executor = this.dbh.db): Promise<Array<{ machineId: string; amount: string; acres: string }>> {
    const result = await executePrepared<{ machineId: string; amount: string; acres: string }>(executor, sql`
      with sheet as (
        select id from rate_sheets
        where operation_id = ${operationId} and relationship = 'neighbour' and party_id is null and archived_at is null and effective_from <= ${yearBounds(year).to}
        order by effective_from desc, created_at desc
        limit 1
      ),
      work as (
        select machine_id, work_type_id, acres
        from machine_work_type_years
        where operation_id = ${operationId} and year = ${year} and acres > 0
      )
      select w.machine_id as "machineId", sum(w.acres * l.rate)::text as amount, sum(w.acres)::text as acres
      from work w
      join rate_sheet_lines l on l.operation_id = ${operationId} and l.rate_sheet_id = (select id from sheet)
        and l.work_type_id = w.work_type_id and l.unit = 'acre' and l.charge_type = 'custom'
      group by w.machine_id`);
    return result.rows;
  }

  /** Hours per machine per calendar year over every year with entries: the fleet history chart, read on its own route. */
  async hoursByYear(operationId: string, executor: Executor = this.dbh.db): Promise<Array<{ machineId: string; year: number; hours: string }>> {
    const result = await executePrepared<{ machineId: string; year: number; hours: string }>(executor, sql`
      select machine_id as "machineId", year, sum(hours)::text as hours
      from machine_work_type_years
      where operation_id = ${operationId}
      group by 1, 2
      order by 2`);
    return result.rows;
  }

  async machineRatesOf(operationId: string, rateSheetId: string, executor: Executor = this.dbh.db): Promise<Map<string, string>> {
    const result = await executePrepared<{ machineId: string; ratePerHour: string }>(executor, sql`
      select machine_id as "machineId", rate_per_hour::text as "ratePerHour"
      from machine_rates where operation_id = ${operationId} and rate_sheet_id = ${rateSheetId}`);
    return new Map(result.rows.map((row) => [row.machineId, row.ratePerHour]));
  }
}
