import { Inject, Injectable } from '@nestjs/common';
import { and, asc, count, desc, eq, ilike, type SQL } from 'drizzle-orm';
import { parties, type Executor, type NewParty, type Party } from '@hitchbook/db';
import { DB, type DbHandle } from '../../core/database.js';

export interface PartyListFilter {
  kind?: 'household' | 'customer';
  q?: string;
  sort: string;
  limit: number;
  offset: number;
}

const SORTS: Record<string, SQL> = {
  name: asc(parties.name),
  '-name': desc(parties.name),
  kind: asc(parties.kind),
  '-kind': desc(parties.kind),
  createdAt: asc(parties.createdAt),
  '-createdAt': desc(parties.createdAt),
};

/** Every query is scoped by the operation id passed first. */
@Injectable()
export class PartiesRepository {
  constructor(@Inject(DB) private readonly dbh: DbHandle) {}

  async list(operationId: string, filter: PartyListFilter): Promise<{ rows: Party[]; total: number }> {
    const where = and(
      eq(parties.operationId, operationId),
      filter.kind ? eq(parties.kind, filter.kind) : undefined,
      filter.q ? ilike(parties.name, `%${filter.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`) : undefined,
    );
    const [rows, totals] = await Promise.all([
      this.dbh.db.select().from(parties).where(where).orderBy(SORTS[filter.sort] ?? asc(parties.name), asc(parties.id)).limit(filter.limit).offset(filter.offset),
      this.dbh.db.select({ n: count() }).from(parties).where(where),
    ]);
    return { rows, total: totals[0]?.n ?? 0 };
  }

  async find(operationId: string, id: string, executor: Executor = this.dbh.db): Promise<Party | undefined> {
    const [row] = await executor.select().from(parties).where(and(eq(parties.operationId, operationId), eq(parties.id, id)));
    return row;
  }

  async insert(operationId: string, values: Omit<NewParty, 'operationId' | 'id'>, executor: Executor = this.dbh.db): Promise<Party> {
    const [row] = await executor.insert(parties).values({ ...values, operationId }).returning();
    return row!;
  }

  async update(operationId: string, id: string, values: Partial<Omit<NewParty, 'operationId' | 'id'>>, executor: Executor = this.dbh.db): Promise<Party | undefined> {
    const [row] = await executor.update(parties).set(values).where(and(eq(parties.operationId, operationId), eq(parties.id, id))).returning();
    return row;
  }

  async countByKind(operationId: string): Promise<Record<'household' | 'customer', number>> {
    const rows = await this.dbh.db.select({ kind: parties.kind, n: count() }).from(parties).where(eq(parties.operationId, operationId)).groupBy(parties.kind);
    const out = { household: 0, customer: 0 };
    for (const r of rows) out[r.kind] = r.n;
    return out;
  }
}
