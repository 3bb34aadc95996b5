import { Inject, Injectable } from '@nestjs/common';
import type { Party } from '@hitchbook/db';
import type { Page } from '@hitchbook/shared/schemas/common';
import type { PartyInput } from '@hitchbook/shared/schemas/users';
import type { Actor } from '../../common/auth/actor.js';
import { notFound } from '../../common/errors/app-error.js';
import { AuditService } from '../../core/audit.service.js';
import { DB, type DbHandle } from '../../core/database.js';
import { PartiesRepository, type PartyListFilter } from './parties.repository.js';

export interface PartyDto {
  id: string;
  kind: 'household' | 'customer';
  name: string;
  relationship: 'family' | 'neighbour' | 'agency';
  email: string | null;
  phone: string | null;
  address: string | null;
  notes: string | null;
}

/** Operators see names only: contact details of customers are not theirs to read. */
function toDto(p: Party, actor: Actor): PartyDto {
  const full = actor.role !== 'operator';
  return {
    id: p.id,
    kind: p.kind,
    name: p.name,
    relationship: p.relationship,
    email: full ? p.email : null,
    phone: full ? p.phone : null,
    address: full ? p.address : null,
    notes: full ? p.notes : null,
  };
}

@Injectable()
export class PartiesService {
  constructor(
    @Inject(DB) private readonly dbh: DbHandle,
    @Inject(PartiesRepository) private readonly repo: PartiesRepository,
    @Inject(AuditService) private readonly audit: AuditService,
  ) {}

  async list(actor: Actor, query: { page: number; pageSize: number; sort: string; q?: string; kind?: 'household' | 'customer' }): Promise<Page<PartyDto>> {
    const filter: PartyListFilter = { kind: query.kind, q: query.q, sort: query.sort, limit: query.pageSize, offset: (query.page - 1) * query.pageSize };
    const { rows, total } = await this.repo.list(actor.operationId, filter);
    return { items: rows.map((p) => toDto(p, actor)), total, page: query.page, pageSize: query.pageSize };
  }

  async get(actor: Actor, id: string): Promise<PartyDto> {
    const row = await this.repo.find(actor.operationId, id);
    if (!row) throw notFound('No such party.');
    return toDto(row, actor);
  }

  async create(actor: Actor, input: PartyInput): Promise<PartyDto> {
    return this.dbh.db.transaction(async (tx) => {
      const row = await this.repo.insert(actor.operationId, normalise(input), tx);
      await this.audit.record(this.audit.byActor(actor, 'party.created', 'party', row.id, { after: row }), tx);
      return toDto(row, actor);
    });
  }

  async update(actor: Actor, id: string, input: Partial<PartyInput>): Promise<PartyDto> {
    return this.dbh.db.transaction(async (tx) => {
      const before = await this.repo.find(actor.operationId, id, tx);
      if (!before) throw notFound('No such party.');
      const after = await this.repo.update(actor.operationId, id, normalise(input), tx);
      await this.audit.record(this.audit.byActor(actor, 'party.updated', 'party', id, { before, after }), tx);
      return toDto(after!, actor);
    });
  }
}

function normalise<T extends Partial<PartyInput>>(input: T) {
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(input)) if (v !== undefined) out[k] = v;
  return out as { [K in keyof T]: Exclude<T[K], undefined> };
}
