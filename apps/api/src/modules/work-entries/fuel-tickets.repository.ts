import { Inject, Injectable } from '@nestjs/common';
import { and, eq, inArray, sql } from 'drizzle-orm';
import { costEntries, type Executor } from '@hitchbook/db';
import { columnsOf } from '../../common/sql-arrays.js';
import { DB, type DbHandle } from '../../core/database.js';
import type { FuelColumns } from './import-rows.js';

/** Fuel tickets from a CSV become fuel cost entries; every query is scoped by the operation id first. */
@Injectable()
export class FuelTicketsRepository {
  constructor(@Inject(DB) private readonly dbh: DbHandle) {}

  async existingImportKeys(operationId: string, keys: string[], executor: Executor = this.dbh.db): Promise<Set<string>> {
    if (keys.length === 0) return new Set();
    const rows = await executor
      .select({ key: costEntries.importKey })
      .from(costEntries)
      .where(and(eq(costEntries.operationId, operationId), inArray(costEntries.importKey, keys)));
    return new Set(rows.map((r) => r.key!));
  }

  /**
   * A batch of tickets in one statement, each column as one array parameter (as work entries are imported). A
   * ticket whose import key is already stored is left out, never stored twice.
   */
  async insertImported(operationId: string, rows: Array<FuelColumns & { importKey: string; createdBy: string }>, tx: Executor): Promise<Array<{ id: string; importKey: string }>> {
    if (rows.length === 0) return [];
    const column = columnsOf(rows);
    const result = await tx.execute<{ id: string; importKey: string }>(sql`
      insert into cost_entries (operation_id, category, machine_id, incurred_on, amount, gallons, meter_hours, vendor, paid_by_party_id, notes, import_key, created_by)
      select ${operationId}::uuid, 'fuel', r.* from unnest(
        ${column('uuid', (r) => r.machineId)}, ${column('date', (r) => r.incurredOn)}, ${column('numeric', (r) => r.amount)},
        ${column('numeric', (r) => r.gallons)}, ${column('numeric', (r) => r.meterHours)}, ${column('text', (r) => r.vendor)},
        ${column('uuid', (r) => r.paidByPartyId)}, ${column('text', (r) => r.notes)}, ${column('text', (r) => r.importKey)},
        ${column('uuid', (r) => r.createdBy)}
      ) as r
      on conflict (operation_id, import_key) do nothing
      returning id, import_key as "importKey"`);
    return result.rows;
  }
}
