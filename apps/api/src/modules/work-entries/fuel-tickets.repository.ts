import { Inject, Injectable } from '@nestjs/common';
import { and, eq, inArray } from 'drizzle-orm';
import { costEntries, type Executor } from '@hitchbook/db';
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

  /** A ticket whose import key is already stored is left out, never stored twice. */
  async insertImported(operationId: string, rows: Array<FuelColumns & { importKey: string; createdBy: string }>, tx: Executor): Promise<Array<{ id: string; importKey: string | null }>> {
    if (rows.length === 0) return [];
    return tx
      .insert(costEntries)
      .values(rows.map((r) => ({ ...r, operationId, category: 'fuel' as const })))
      .onConflictDoNothing({ target: [costEntries.operationId, costEntries.importKey] })
      .returning({ id: costEntries.id, importKey: costEntries.importKey });
  }
}
