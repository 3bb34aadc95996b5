import { Inject, Injectable } from '@nestjs/common';
import type { AuditEntryDto, AuditListQuery } from '@hitchbook/shared/schemas/audit';
import type { Page } from '@hitchbook/shared/schemas/common';
import type { Actor } from '../../common/auth/actor.js';
import { summariseChange } from './audit-changes.js';
import { AuditRepository } from './audit.repository.js';

/** The audit log as the owner and the bookkeeper read it: newest first, one operation only. */
@Injectable()
export class AuditReadService {
  constructor(@Inject(AuditRepository) private readonly repo: AuditRepository) {}

  async list(actor: Actor, query: AuditListQuery): Promise<Page<AuditEntryDto>> {
    const { rows, total } = await this.repo.page(actor.operationId, query);
    return {
      items: rows.map(({ entry, actorName, actorEmail }) => ({
        id: entry.id,
        at: entry.createdAt.toISOString(),
        actor: entry.actorUserId && actorName !== null && actorEmail !== null ? { userId: entry.actorUserId, name: actorName, email: actorEmail } : null,
        action: entry.action,
        entityType: entry.entityType,
        entityId: entry.entityId,
        changes: summariseChange(entry.before, entry.after),
      })),
      total,
      page: query.page,
      pageSize: query.pageSize,
    };
  }
}
