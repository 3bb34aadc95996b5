import { Inject, Injectable } from '@nestjs/common';
import { and, asc, count, eq } from 'drizzle-orm';
import { uploads, workEntryPhotos, type Executor, type Upload } from '@hitchbook/db';
import { DB, type DbHandle } from '../../core/database.js';

/** Every query is scoped by the operation id passed first. */
@Injectable()
export class EntryPhotosRepository {
  constructor(@Inject(DB) private readonly dbh: DbHandle) {}

  async list(operationId: string, workEntryId: string, executor: Executor = this.dbh.db): Promise<Upload[]> {
    const rows = await executor
      .select({ upload: uploads })
      .from(workEntryPhotos)
      .innerJoin(uploads, and(eq(uploads.operationId, workEntryPhotos.operationId), eq(uploads.id, workEntryPhotos.uploadId)))
      .where(and(eq(workEntryPhotos.operationId, operationId), eq(workEntryPhotos.workEntryId, workEntryId)))
      .orderBy(asc(uploads.createdAt), asc(uploads.id));
    return rows.map((r) => r.upload);
  }

  async find(operationId: string, workEntryId: string, uploadId: string, executor: Executor = this.dbh.db): Promise<Upload | undefined> {
    const [row] = await executor
      .select({ upload: uploads })
      .from(workEntryPhotos)
      .innerJoin(uploads, and(eq(uploads.operationId, workEntryPhotos.operationId), eq(uploads.id, workEntryPhotos.uploadId)))
      .where(and(eq(workEntryPhotos.operationId, operationId), eq(workEntryPhotos.workEntryId, workEntryId), eq(workEntryPhotos.uploadId, uploadId)));
    return row?.upload;
  }

  async count(operationId: string, workEntryId: string, tx: Executor): Promise<number> {
    const [row] = await tx
      .select({ n: count() })
      .from(workEntryPhotos)
      .where(and(eq(workEntryPhotos.operationId, operationId), eq(workEntryPhotos.workEntryId, workEntryId)));
    return row!.n;
  }

  async insert(operationId: string, workEntryId: string, uploadId: string, tx: Executor): Promise<void> {
    await tx.insert(workEntryPhotos).values({ operationId, workEntryId, uploadId });
  }

  async uploadIdsOf(operationId: string, workEntryId: string, tx: Executor): Promise<string[]> {
    const rows = await tx
      .select({ id: workEntryPhotos.uploadId })
      .from(workEntryPhotos)
      .where(and(eq(workEntryPhotos.operationId, operationId), eq(workEntryPhotos.workEntryId, workEntryId)));
    return rows.map((r) => r.id);
  }
}
