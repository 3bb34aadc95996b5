import { Inject, Injectable } from '@nestjs/common';
import { sql } from 'drizzle-orm';
import type { Executor } from '@hitchbook/db';
import { DB, type DbHandle } from '../../core/database.js';
import { numericArray, uuidArray } from '../../common/sql-arrays.js';

// Writes the new family rate sheet that accepted suggestions go into. The rate-sheet feature owns these
// tables; this is the one write the year-end report makes, every statement scoped by the operation id.

export type SheetRef = {
  id: string;
  relationship: 'family' | 'neighbour' | 'agency';
  partyId: string | null;
};

@Injectable()
export class SuggestedRatesRepository {
  constructor(@Inject(DB) private readonly dbh: DbHandle) {}

  async sheet(operationId: string, id: string, executor: Executor = this.dbh.db): Promise<SheetRef | null> {
    const result = await executor.execute<SheetRef>(sql`
      select id, relationship, party_id as "partyId" from rate_sheets where operation_id = ${operationId} and id = ${id}`);
    return result.rows[0] ?? null;
  }

  /** Serialises acceptances of one operation, so two cannot both create next year's sheet. */
  async lockOperation(operationId: string, executor: Executor): Promise<void> {
    await executor.execute(sql`select pg_advisory_xact_lock(hashtext('suggested-rates'), hashtext(${operationId}))`);
  }

  async familySheetStartingOn(operationId: string, day: string, executor: Executor): Promise<string | null> {
    const result = await executor.execute<{ id: string }>(sql`
      select id from rate_sheets
      where operation_id = ${operationId} and relationship = 'family' and party_id is null and archived_at is null and effective_from = ${day}`);
    return result.rows[0]?.id ?? null;
  }

  /** A new family sheet: the base sheet's terms, work-type rates and other machines' rates, or the defaults without one. */
  async createSheet(operationId: string, name: string, effectiveFrom: string, baseId: string | null, executor: Executor): Promise<string> {
    const inserted = baseId
      ? await executor.execute<{ id: string }>(sql`
          insert into rate_sheets (operation_id, name, relationship, effective_from, minimum_charge, minimum_per, travel_flat, travel_per_mile,
                                   fuel_base_price, fuel_step, fuel_adjust_pct_per_step, operator_wage, labor_factor, terms_days, notes)
          select operation_id, ${name}, 'family', ${effectiveFrom}, minimum_charge, minimum_per, travel_flat, travel_per_mile,
                 fuel_base_price, fuel_step, fuel_adjust_pct_per_step, operator_wage, labor_factor, terms_days, notes
          from rate_sheets where operation_id = ${operationId} and id = ${baseId}
          returning id`)
      : await executor.execute<{ id: string }>(sql`
          insert into rate_sheets (operation_id, name, relationship, effective_from) values (${operationId}, ${name}, 'family', ${effectiveFrom})
          returning id`);
    const id = inserted.rows[0]!.id;
    if (baseId) {
      await executor.execute(sql`
        insert into rate_sheet_lines (operation_id, rate_sheet_id, work_type_id, unit, rate, charge_type, minimum_charge)
        select operation_id, ${id}, work_type_id, unit, rate, charge_type, minimum_charge
        from rate_sheet_lines where operation_id = ${operationId} and rate_sheet_id = ${baseId}`);
    }
    return id;
  }

  /** The base sheet's machine rates for machines not being re-rated, then the accepted rates. */
  async setMachineRates(operationId: string, sheetId: string, baseId: string | null, rates: ReadonlyArray<{ machineId: string; ratePerHour: string }>, executor: Executor): Promise<void> {
    const ids = rates.map((rate) => rate.machineId);
    if (baseId) {
      await executor.execute(sql`
        insert into machine_rates (operation_id, rate_sheet_id, machine_id, rate_per_hour)
        select operation_id, ${sheetId}, machine_id, rate_per_hour
        from machine_rates where operation_id = ${operationId} and rate_sheet_id = ${baseId} and not (machine_id = any(${uuidArray(ids)}))`);
    }
    await executor.execute(sql`
      insert into machine_rates (operation_id, rate_sheet_id, machine_id, rate_per_hour)
      select ${operationId}, ${sheetId}, r.machine_id, r.rate_per_hour
      from unnest(${uuidArray(ids)}, ${numericArray(rates.map((rate) => rate.ratePerHour))}) as r(machine_id, rate_per_hour)`);
  }
}
