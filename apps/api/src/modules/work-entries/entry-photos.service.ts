import { Inject, Injectable } from '@nestjs/common';
import type { Executor, Upload } from '@hitchbook/db';
import { MAX_ENTRY_PHOTOS, type WorkEntryPhotoDto } from '@hitchbook/shared/schemas/work-entries';
import type { Actor } from '../../common/auth/actor.js';
import { conflict, notFound } from '../../common/errors/app-error.js';
import { AuditService } from '../../core/audit.service.js';
import { DB, type DbHandle } from '../../core/database.js';
import { UploadsService, type ReceivedFile, type UploadDownload } from '../uploads/uploads.service.js';
import { requireEntryAccess, type EntryAction } from './entry-access.js';
import { EntryPhotosRepository } from './entry-photos.repository.js';
import { WorkEntriesRepository } from './work-entries.repository.js';

function toDto(row: Pick<Upload, 'id' | 'originalName' | 'contentType' | 'sizeBytes'> & { createdAt: Date | string }): WorkEntryPhotoDto {
  return {
    uploadId: row.id,
    originalName: row.originalName,
    contentType: row.contentType,
    sizeBytes: row.sizeBytes,
    createdAt: typeof row.createdAt === 'string' ? row.createdAt : row.createdAt.toISOString(),
  };
}

/**
 * Photos of a work entry. They are seen by whoever sees the entry and change while the entry may
 * change: an approved entry only after reopening, an invoiced or squared one never.
 */
@Injectable()
export class EntryPhotosService {
  constructor(
    @Inject(DB) private readonly dbh: DbHandle,
    @Inject(WorkEntriesRepository) private readonly entries: WorkEntriesRepository,
    @Inject(EntryPhotosRepository) private readonly photos: EntryPhotosRepository,
    @Inject(UploadsService) private readonly uploads: UploadsService,
    @Inject(AuditService) private readonly audit: AuditService,
  ) {}

  async list(actor: Actor, entryId: string): Promise<WorkEntryPhotoDto[]> {
    await this.visibleOrThrow(actor, entryId, 'read');
    return (await this.photos.list(actor.operationId, entryId)).map(toDto);
  }

  async download(actor: Actor, entryId: string, uploadId: string): Promise<UploadDownload> {
    await this.visibleOrThrow(actor, entryId, 'read');
    const row = await this.photos.find(actor.operationId, entryId, uploadId);
    if (!row) throw notFound('No such photo on this entry.');
    return this.uploads.fileOf(row);
  }

  async attach(actor: Actor, entryId: string, file: ReceivedFile | undefined): Promise<WorkEntryPhotoDto> {
    // Answer "no such entry" or "approved" before looking at the file; the locked check below is the one that holds.
    await this.visibleOrThrow(actor, entryId, 'edit');
    const stored = await this.uploads.create(actor, 'entry-photo', file, async (row, tx) => {
      await this.lockOrThrow(actor, entryId, tx);
      if ((await this.photos.count(actor.operationId, entryId, tx)) >= MAX_ENTRY_PHOTOS) {
        throw conflict(`An entry holds at most ${MAX_ENTRY_PHOTOS} photos; remove one before adding another.`);
      }
      await this.photos.insert(actor.operationId, entryId, row.id, tx);
      await this.audit.record(this.audit.byActor(actor, 'work-entry.photo-added', 'work-entry', entryId, { after: { uploadId: row.id, originalName: row.originalName } }), tx);
    });
    return toDto(stored);
  }

  async remove(actor: Actor, entryId: string, uploadId: string): Promise<void> {
    const keys = await this.dbh.db.transaction(async (tx) => {
      await this.lockOrThrow(actor, entryId, tx);
      const row = await this.photos.find(actor.operationId, entryId, uploadId, tx);
      if (!row) throw notFound('No such photo on this entry.');
      const removed = await this.uploads.deleteRows(actor.operationId, [uploadId], tx);
      await this.audit.record(this.audit.byActor(actor, 'work-entry.photo-removed', 'work-entry', entryId, { before: { uploadId, originalName: row.originalName } }), tx);
      return removed;
    });
    await this.uploads.discardFiles(keys);
  }

  /** For deleting an entry: its photos go with it, in its transaction; the files go after commit. */
  async deleteAllOf(operationId: string, entryId: string, tx: Executor): Promise<string[]> {
    return this.uploads.deleteRows(operationId, await this.photos.uploadIdsOf(operationId, entryId, tx), tx);
  }

  discardFiles(storageKeys: string[]): Promise<void> {
    return this.uploads.discardFiles(storageKeys);
  }

  private async visibleOrThrow(actor: Actor, entryId: string, action: Extract<EntryAction, 'read' | 'edit'>): Promise<void> {
    const entry = await this.entries.findView(actor.operationId, entryId);
    if (!entry) throw notFound('No such work entry.');
    requireEntryAccess(actor, action, entry);
  }

  private async lockOrThrow(actor: Actor, entryId: string, tx: Executor): Promise<void> {
    const locked = await this.entries.lockForChange(actor.operationId, entryId, tx);
    if (!locked) throw notFound('No such work entry.');
    requireEntryAccess(actor, 'edit', locked.entry, locked.onInvoice);
  }
}
