import { Inject, Injectable } from '@nestjs/common';
import { auditLog, type Executor } from '@hitchbook/db';
import type { Actor } from '../common/auth/actor.js';
import { DB, type DbHandle } from './database.js';

export interface AuditRecord {
  operationId: string | null;
  actorUserId: string | null;
  action: string;
  entityType: string;
  entityId?: string | null;
  before?: unknown;
  after?: unknown;
}

@Injectable()
export class AuditService {
  constructor(@Inject(DB) private readonly dbh: DbHandle) {}

  /** Pass the transaction that made the change, so the audit row commits or rolls back with it. */
  async record(entry: AuditRecord, executor: Executor = this.dbh.db): Promise<void> {
    await executor.insert(auditLog).values({
      operationId: entry.operationId,
      actorUserId: entry.actorUserId,
      action: entry.action,
      entityType: entry.entityType,
      entityId: entry.entityId ?? null,
      before: entry.before ?? null,
      after: entry.after ?? null,
    });
  }

  byActor(actor: Actor, action: string, entityType: string, entityId: string, change: { before?: unknown; after?: unknown } = {}): AuditRecord {
    return { operationId: actor.operationId, actorUserId: actor.userId, action, entityType, entityId, ...change };
  }
}
