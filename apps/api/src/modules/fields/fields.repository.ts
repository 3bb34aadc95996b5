import { Inject, Injectable } from '@nestjs/common';
import { and, asc, count, desc, eq, getTableColumns, ilike, isNotNull, isNull, or, sql, type SQL } from 'drizzle-orm';
import { fields, parties, type Executor, type Field, type NewField } from '@hitchbook/db';
import type { FieldListQuery } from '@hitchbook/shared/schemas/fields';
import { DB, type DbHandle } from '../../core/database.js';

/** An ILIKE pattern matching the text anywhere, with the caller's % and _ taken literally. */
const containsPattern = (text: string) => `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

const SORTS: Record<FieldListQuery['sort'], SQL> = {
  name: asc(fields.name),
  '-name': desc(fields.name),
  acres: asc(fields.acres),
  '-acres': desc(fields.acres),
  farmLabel: asc(fields.farmLabel),
  '-farmLabel': desc(fields.farmLabel),
  createdAt: asc(fields.createdAt),
  '-createdAt': desc(fields.createdAt),
};

/** A field row without its boundary (which can be large), as tables list it. */
export type FieldListRow = Omit<Field, 'boundary'> & { hasBoundary: boolean; ownerName: string | null };
export type FieldRow = Field & { ownerName: string | null };

const { boundary: _boundary, ...listColumns } = getTableColumns(fields);

/** Every query is scoped by the operation id passed first. */
@Injectable()
export class FieldsRepository {
  constructor(@Inject(DB) private readonly dbh: DbHandle) {}

  private ownerJoin() {
    return and(eq(parties.operationId, fields.operationId), eq(parties.id, fields.ownerPartyId));
  }

  async list(operationId: string, filter: FieldListQuery): Promise<{ rows: FieldListRow[]; total: number }> {
    const where = and(
      eq(fields.operationId, operationId),
      filter.kind ? eq(fields.kind, filter.kind) : undefined,
      filter.farmLabel ? eq(fields.farmLabel, filter.farmLabel) : undefined,
      filter.ownerPartyId ? eq(fields.ownerPartyId, filter.ownerPartyId) : undefined,
      filter.archived === 'all' ? undefined : filter.archived === 'true' ? isNotNull(fields.archivedAt) : isNull(fields.archivedAt),
      filter.q
        ? or(ilike(fields.name, containsPattern(filter.q)), ilike(fields.farmLabel, containsPattern(filter.q)), ilike(fields.roadName, containsPattern(filter.q)))
        : undefined,
    );
    const [rows, totals] = await Promise.all([
      this.dbh.db
        .select({ ...listColumns, hasBoundary: sql<boolean>`${fields.boundary} is not null`, ownerName: parties.name })
        .from(fields)
        .leftJoin(parties, this.ownerJoin())
        .where(where)
        .orderBy(SORTS[filter.sort], asc(fields.name), asc(fields.id))
        .limit(filter.pageSize)
        .offset((filter.page - 1) * filter.pageSize),
      this.dbh.db.select({ n: count() }).from(fields).where(where),
    ]);
    return { rows, total: totals[0]?.n ?? 0 };
  }

  async find(operationId: string, id: string, executor: Executor = this.dbh.db): Promise<FieldRow | undefined> {
    const [row] = await executor
      .select({ ...getTableColumns(fields), ownerName: parties.name })
      .from(fields)
      .leftJoin(parties, this.ownerJoin())
      .where(and(eq(fields.operationId, operationId), eq(fields.id, id)));
    return row;
  }

  async insert(operationId: string, values: Omit<NewField, 'operationId' | 'id'>, executor: Executor = this.dbh.db): Promise<Field> {
    const [row] = await executor.insert(fields).values({ ...values, operationId }).returning();
    return row!;
  }

  async update(operationId: string, id: string, values: Partial<Omit<NewField, 'operationId' | 'id' | 'kind'>>, executor: Executor = this.dbh.db): Promise<void> {
    await executor.update(fields).set(values).where(and(eq(fields.operationId, operationId), eq(fields.id, id)));
  }
}
