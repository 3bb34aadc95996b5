import { Inject, Injectable } from '@nestjs/common';
import { and, asc, count, eq, ilike, or } from 'drizzle-orm';
import { workTypes, type Executor, type NewWorkType, type WorkType } from '@hitchbook/db';
import { DB, type DbHandle } from '../../core/database.js';

/** An ILIKE pattern matching the text anywhere, with the caller's % and _ taken literally. */
const containsPattern = (text: string) => `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

export interface WorkTypeListFilter {
  q?: string;
  archived: 'false' | 'true' | 'all';
  limit: number;
  offset: number;
}

/** Every query is scoped by the operation id passed first. */
@Injectable()
export class WorkTypesRepository {
  constructor(@Inject(DB) private readonly dbh: DbHandle) {}

  async list(operationId: string, filter: WorkTypeListFilter): Promise<{ rows: WorkType[]; total: number }> {
    const where = and(
      eq(workTypes.operationId, operationId),
      filter.archived === 'all' ? undefined : eq(workTypes.archived, filter.archived === 'true'),
      filter.q ? or(ilike(workTypes.name, containsPattern(filter.q)), ilike(workTypes.key, containsPattern(filter.q))) : undefined,
    );
    const [rows, totals] = await Promise.all([
      this.dbh.db.select().from(workTypes).where(where).orderBy(asc(workTypes.name), asc(workTypes.id)).limit(filter.limit).offset(filter.offset),
      this.dbh.db.select({ n: count() }).from(workTypes).where(where),
    ]);
    return { rows, total: totals[0]?.n ?? 0 };
  }

  async find(operationId: string, id: string, executor: Executor = this.dbh.db): Promise<WorkType | undefined> {
    const [row] = await executor.select().from(workTypes).where(and(eq(workTypes.operationId, operationId), eq(workTypes.id, id)));
    return row;
  }

  async insert(operationId: string, values: Omit<NewWorkType, 'operationId' | 'id'>, executor: Executor = this.dbh.db): Promise<WorkType> {
    const [row] = await executor.insert(workTypes).values({ ...values, operationId }).returning();
    return row!;
  }

  async update(operationId: string, id: string, values: Partial<Omit<NewWorkType, 'operationId' | 'id' | 'key'>>, executor: Executor = this.dbh.db): Promise<WorkType | undefined> {
    const [row] = await executor.update(workTypes).set(values).where(and(eq(workTypes.operationId, operationId), eq(workTypes.id, id))).returning();
    return row;
  }
}
