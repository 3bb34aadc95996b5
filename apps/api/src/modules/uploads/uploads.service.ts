import { createHash, randomBytes } from 'node:crypto';
import type { Readable } from 'node:stream';
import { Inject, Injectable } from '@nestjs/common';
import type { Executor, Upload } from '@hitchbook/db';
import type { BoundaryGeometry } from '@hitchbook/shared/schemas/fields';
import type { UploadDto, UploadPurpose } from '@hitchbook/shared/schemas/machines';
import type { Actor } from '../../common/auth/actor.js';
import { forbidden, invalid, notFound } from '../../common/errors/app-error.js';
import { AuditService } from '../../core/audit.service.js';
import { DB, type DbHandle } from '../../core/database.js';
import { attachmentDisposition, boundaryFromFileOrThrow, fileKindOrThrow, safeFileName } from './file-content.js';
import { PURPOSES } from './upload-kinds.js';
import { UPLOAD_STORAGE, type UploadStorage } from './upload-storage.js';
import { UploadsRepository } from './uploads.repository.js';

export interface ReceivedFile {
  originalname: string;
  buffer: Buffer;
}

export interface UploadDownload {
  stream: Readable;
  contentType: string;
  length: number;
  disposition: string;
}

function toDto(row: Upload): UploadDto {
  return {
    id: row.id,
    purpose: row.purpose as UploadPurpose,
    originalName: row.originalName,
    contentType: row.contentType,
    sizeBytes: row.sizeBytes,
    sha256: row.sha256,
    createdAt: row.createdAt.toISOString(),
  };
}

async function readAll(stream: Readable): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const chunk of stream) chunks.push(chunk as Buffer);
  return Buffer.concat(chunks);
}

@Injectable()
export class UploadsService {
  constructor(
    @Inject(DB) private readonly dbh: DbHandle,
    @Inject(UploadsRepository) private readonly repo: UploadsRepository,
    @Inject(UPLOAD_STORAGE) private readonly storage: UploadStorage,
    @Inject(AuditService) private readonly audit: AuditService,
  ) {}

  /**
   * Checks and stores one file. `attach`, when given, runs in the same transaction as the upload's
   * row, so a file that cannot be linked to its record is neither kept nor left on disk.
   */
  async create(actor: Actor, purpose: UploadPurpose, file: ReceivedFile | undefined, attach?: (row: Upload, tx: Executor) => Promise<void>): Promise<UploadDto> {
    const rules = PURPOSES[purpose];
    if (!rules.uploaders.includes(actor.role)) throw forbidden(`Your role may not upload a ${purpose}.`);
    if (rules.sentThrough && !attach) throw invalid('purpose', `An ${purpose} is sent to ${rules.sentThrough}, so it belongs to its record from the start.`);
    if (!file) throw invalid('file', 'Attach the file in the form field "file".');
    const originalName = safeFileName(file.originalname);
    const kind = await fileKindOrThrow(file.buffer, originalName, purpose);
    const storageKey = randomBytes(32).toString('hex');
    await this.storage.put(storageKey, file.buffer);
    try {
      return await this.dbh.db.transaction(async (tx) => {
        const row = await this.repo.insert(
          actor.operationId,
          {
            purpose,
            originalName,
            contentType: kind.contentType,
            sizeBytes: file.buffer.length,
            storageKey,
            sha256: createHash('sha256').update(file.buffer).digest('hex'),
            createdBy: actor.userId,
          },
          tx,
        );
        await this.audit.record(this.audit.byActor(actor, 'upload.created', 'upload', row.id, { after: toDto(row) }), tx);
        await attach?.(row, tx);
        return toDto(row);
      });
    } catch (err) {
      // No row points at the file: remove it rather than leave an orphan on disk.
      await this.storage.remove(storageKey);
      throw err;
    }
  }

  /** Receipts go to money roles only; to anyone else they do not exist (404), like other operations' files. */
  async download(actor: Actor, id: string): Promise<UploadDownload> {
    const row = await this.repo.find(actor.operationId, id);
    if (!row || !PURPOSES[row.purpose as UploadPurpose]?.readers.includes(actor.role)) throw notFound('No such file.');
    return this.fileOf(row);
  }

  /** The stored bytes of a row the caller has already been allowed to see. */
  async fileOf(row: Upload): Promise<UploadDownload> {
    const stream = await this.storage.open(row.storageKey).catch(() => {
      throw notFound('The stored file is no longer available.');
    });
    return { stream, contentType: row.contentType, length: row.sizeBytes, disposition: attachmentDisposition(row.originalName) };
  }

  /**
   * Deletes upload rows inside the caller's transaction (links to them cascade) and returns the
   * stored files' keys, for `discardFiles` once that transaction has committed.
   */
  async deleteRows(operationId: string, ids: string[], tx: Executor): Promise<string[]> {
    return this.repo.delete(operationId, ids, tx);
  }

  /** Best effort: a file left behind is unreachable (no row names it) and harmless. */
  async discardFiles(storageKeys: string[]): Promise<void> {
    await Promise.all(storageKeys.map((key) => this.storage.remove(key).catch(() => undefined)));
  }

  /** For a body field that names an upload: it must be this operation's and of the expected purpose. */
  async requireOrThrow(operationId: string, id: string, purpose: UploadPurpose, path: string, executor?: Executor): Promise<Upload> {
    const row = await this.repo.find(operationId, id, executor);
    if (!row) throw invalid(path, 'No such upload.');
    if (row.purpose !== purpose) throw invalid(path, `That upload is a ${row.purpose}, not a ${purpose}.`);
    return row;
  }

  /** The geometry of an uploaded field-boundary file. */
  async boundaryOrThrow(operationId: string, id: string, path: string): Promise<BoundaryGeometry> {
    const row = await this.requireOrThrow(operationId, id, 'field-boundary', path);
    const stream = await this.storage.open(row.storageKey).catch(() => {
      throw invalid(path, 'The uploaded file is no longer available; upload it again.');
    });
    return boundaryFromFileOrThrow(await readAll(stream), path);
  }
}
