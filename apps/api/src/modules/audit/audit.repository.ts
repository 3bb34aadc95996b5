import { Inject, Injectable } from '@nestjs/common';
import { and, count, desc, eq, gte, lt, notLike, type SQL } from 'drizzle-orm';
import { auditLog, users } from '@hitchbook/db';
import type { AuditListQuery } from '@hitchbook/shared/schemas/audit';
import { DB, type DbHandle } from '../../core/database.js';

function nextDay(isoDate: string): Date {
  const d = new Date(`${isoDate}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + 1);
  return d;
}

/** Reads of the audit log, always inside one operation. */
@Injectable()
export class AuditRepository {
  constructor(@Inject(DB) private readonly dbh: DbHandle) {}

  async page(operationId: string, q: AuditListQuery) {
    // Sign-ins are recorded for security reviews but change nothing, so the reader of changes leaves them out.
    const where: SQL[] = [eq(auditLog.operationId, operationId), notLike(auditLog.action, 'auth.%')];
    if (q.entityType) where.push(eq(auditLog.entityType, q.entityType));
    if (q.entityId) where.push(eq(auditLog.entityId, q.entityId));
    if (q.actorUserId) where.push(eq(auditLog.actorUserId, q.actorUserId));
    if (q.from) where.push(gte(auditLog.createdAt, new Date(`${q.from}T00:00:00Z`)));
    if (q.to) where.push(lt(auditLog.createdAt, nextDay(q.to)));
    const filter = and(...where);
    const db = this.dbh.db;
    const [rows, [total]] = await Promise.all([
      db
        .select({ entry: auditLog, actorName: users.name, actorEmail: users.email })
        .from(auditLog)
        .leftJoin(users, eq(users.id, auditLog.actorUserId))
        .where(filter)
        .orderBy(desc(auditLog.createdAt), desc(auditLog.id))
        .limit(q.pageSize)
        .offset((q.page - 1) * q.pageSize),
      db.select({ n: count() }).from(auditLog).where(filter),
    ]);
    return { rows, total: total?.n ?? 0 };
  }
}
