import { Inject, Injectable } from '@nestjs/common';
import { pgErrorOf, UNIQUE_VIOLATION, type WorkType } from '@hitchbook/db';
import type { CautionKey } from '@hitchbook/shared/cautions';
import type { MachineClassId } from '@hitchbook/shared/machine-classes';
import type { Page } from '@hitchbook/shared/schemas/common';
import type { WorkTypeCreate, WorkTypeDto, WorkTypeListQuery, WorkTypeUpdate } from '@hitchbook/shared/schemas/work-types';
import type { Actor } from '../../common/auth/actor.js';
import { AppError, notFound } from '../../common/errors/app-error.js';
import { AuditService } from '../../core/audit.service.js';
import { DB, type DbHandle } from '../../core/database.js';
import { WorkTypesRepository } from './work-types.repository.js';

function toDto(row: WorkType): WorkTypeDto {
  return {
    id: row.id,
    key: row.key,
    name: row.name,
    defaultUnit: row.defaultUnit,
    cautions: row.cautions as CautionKey[],
    typicalClassId: row.typicalClassId as MachineClassId | null,
    archived: row.archived,
  };
}

/** "Hay raking (small square)" -> "hay-raking-small-square". */
function keyFromName(name: string): string {
  const slug = name
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 60)
    .replace(/-+$/, '');
  return slug || 'work-type';
}

@Injectable()
export class WorkTypesService {
  constructor(
    @Inject(DB) private readonly dbh: DbHandle,
    @Inject(WorkTypesRepository) private readonly repo: WorkTypesRepository,
    @Inject(AuditService) private readonly audit: AuditService,
  ) {}

  async list(actor: Actor, query: WorkTypeListQuery): Promise<Page<WorkTypeDto>> {
    const { rows, total } = await this.repo.list(actor.operationId, {
      q: query.q,
      archived: query.archived,
      limit: query.pageSize,
      offset: (query.page - 1) * query.pageSize,
    });
    return { items: rows.map(toDto), total, page: query.page, pageSize: query.pageSize };
  }

  async get(actor: Actor, id: string): Promise<WorkTypeDto> {
    const row = await this.repo.find(actor.operationId, id);
    if (!row) throw notFound('No such work type.');
    return toDto(row);
  }

  async create(actor: Actor, input: WorkTypeCreate): Promise<WorkTypeDto> {
    const key = input.key ?? keyFromName(input.name);
    try {
      return await this.dbh.db.transaction(async (tx) => {
        const row = await this.repo.insert(
          actor.operationId,
          { key, name: input.name, defaultUnit: input.defaultUnit, cautions: input.cautions, typicalClassId: input.typicalClassId ?? null },
          tx,
        );
        await this.audit.record(this.audit.byActor(actor, 'work-type.created', 'work-type', row.id, { after: row }), tx);
        return toDto(row);
      });
    } catch (err) {
      if (pgErrorOf(err)?.code === UNIQUE_VIOLATION) {
        throw new AppError('conflict', 'A work type with this key exists already.', [
          { path: 'key', message: `"${key}" is taken; give another key or name.` },
        ]);
      }
      throw err;
    }
  }

  async update(actor: Actor, id: string, patch: WorkTypeUpdate): Promise<WorkTypeDto> {
    return this.dbh.db.transaction(async (tx) => {
      const before = await this.repo.find(actor.operationId, id, tx);
      if (!before) throw notFound('No such work type.');
      const after = await this.repo.update(actor.operationId, id, patch, tx);
      await this.audit.record(this.audit.byActor(actor, 'work-type.updated', 'work-type', id, { before, after }), tx);
      return toDto(after!);
    });
  }
}
