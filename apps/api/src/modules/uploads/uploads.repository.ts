import { Inject, Injectable } from '@nestjs/common';
import { and, eq, inArray } from 'drizzle-orm';
import { uploads, type Executor, type NewUpload, type Upload } from '@hitchbook/db';
import { DB, type DbHandle } from '../../core/database.js';

/** Every query is scoped by the operation id passed first. */
@Injectable()
export class UploadsRepository {
  constructor(@Inject(DB) private readonly dbh: DbHandle) {}

  async insert(operationId: string, values: Omit<NewUpload, 'operationId' | 'id'>, executor: Executor = this.dbh.db): Promise<Upload> {
    const [row] = await executor.insert(uploads).values({ ...values, operationId }).returning();
    return row!;
  }

  async find(operationId: string, id: string, executor: Executor = this.dbh.db): Promise<Upload | undefined> {
    const [row] = await executor.select().from(uploads).where(and(eq(uploads.operationId, operationId), eq(uploads.id, id)));
    return row;
  }

  async delete(operationId: string, ids: string[], executor: Executor = this.dbh.db): Promise<string[]> {
    if (ids.length === 0) return [];
    const rows = await executor
      .delete(uploads)
      .where(and(eq(uploads.operationId, operationId), inArray(uploads.id, ids)))
      .returning({ storageKey: uploads.storageKey });
    return rows.map((r) => r.storageKey);
  }
}
