import { Inject, Injectable } from '@nestjs/common';
import { and, asc, count, desc, eq, gte, lte, sql } from 'drizzle-orm';
import { squareUps, squareUpTransfers, type Executor, type SquareUp, type SquareUpTransfer } from '@hitchbook/db';
import type { SquareUpStatementDto, SquareUpStatus, TransferPaid } from '@hitchbook/shared/schemas/square-ups';
import { DB, type DbHandle } from '../../core/database.js';

export type SquareUpListRow = Pick<SquareUp, 'id' | 'name' | 'periodFrom' | 'periodTo' | 'status' | 'fixedCostsBy' | 'closedAt' | 'createdAt'> & {
  transfers: number;
  transfersPaid: number;
  positiveBalances: string | null;
};

/** Periods and their transfers; every query is scoped by the operation id passed first. */
@Injectable()
export class SquareUpsRepository {
  constructor(@Inject(DB) private readonly dbh: DbHandle) {}

  /** Serialises period creation in one operation, so two overlapping periods cannot both pass the check. */
  async lockOperation(operationId: string, executor: Executor): Promise<void> {
    await executor.execute(sql`select pg_advisory_xact_lock(hashtext('square-up-periods'), hashtext(${operationId}))`);
  }

  async overlapping(operationId: string, from: string, to: string, executor: Executor): Promise<SquareUp | undefined> {
    const [row] = await executor
      .select()
      .from(squareUps)
      .where(and(eq(squareUps.operationId, operationId), lte(squareUps.periodFrom, to), gte(squareUps.periodTo, from)))
      .limit(1);
    return row;
  }

  async insert(operationId: string, values: { name: string; periodFrom: string; periodTo: string; fixedCostsBy: 'ownership' | 'use'; createdBy: string }, executor: Executor): Promise<SquareUp> {
    const [row] = await executor.insert(squareUps).values({ ...values, operationId }).returning();
    return row!;
  }

  async list(operationId: string, filter: { status?: SquareUpStatus; limit: number; offset: number }): Promise<{ rows: SquareUpListRow[]; total: number }> {
    const where = and(eq(squareUps.operationId, operationId), filter.status ? eq(squareUps.status, filter.status) : undefined);
    const [rows, totals] = await Promise.all([
      this.dbh.db
        .select({
          id: squareUps.id,
          name: squareUps.name,
          periodFrom: squareUps.periodFrom,
          periodTo: squareUps.periodTo,
          status: squareUps.status,
          fixedCostsBy: squareUps.fixedCostsBy,
          closedAt: squareUps.closedAt,
          createdAt: squareUps.createdAt,
          positiveBalances: sql<string | null>`${squareUps.statement} -> 'totals' ->> 'positiveBalances'`,
          transfers: sql<number>`(select count(*)::int from square_up_transfers t where t.operation_id = square_ups.operation_id and t.square_up_id = square_ups.id)`,
          transfersPaid: sql<number>`(select count(*)::int from square_up_transfers t where t.operation_id = square_ups.operation_id and t.square_up_id = square_ups.id and t.paid_on is not null)`,
        })
        .from(squareUps)
        .where(where)
        .orderBy(desc(squareUps.periodFrom), asc(squareUps.id))
        .limit(filter.limit)
        .offset(filter.offset),
      this.dbh.db.select({ n: count() }).from(squareUps).where(where),
    ]);
    return { rows, total: totals[0]?.n ?? 0 };
  }

  async find(operationId: string, id: string, executor: Executor = this.dbh.db): Promise<SquareUp | undefined> {
    const [row] = await executor.select().from(squareUps).where(and(eq(squareUps.operationId, operationId), eq(squareUps.id, id)));
    return row;
  }

  /** Locks the period for the closing transaction: writers checking the period wait until it commits. */
  async findForUpdate(operationId: string, id: string, executor: Executor): Promise<SquareUp | undefined> {
    const [row] = await executor.select().from(squareUps).where(and(eq(squareUps.operationId, operationId), eq(squareUps.id, id))).for('update');
    return row;
  }

  /** The periods covering a day, locked for share so a period cannot close while the caller's write is in flight. */
  async coveringForShare(operationId: string, day: string, executor: Executor): Promise<SquareUp[]> {
    return executor
      .select()
      .from(squareUps)
      .where(and(eq(squareUps.operationId, operationId), lte(squareUps.periodFrom, day), gte(squareUps.periodTo, day)))
      .for('share');
  }

  /** Closed periods overlapping the days from..to, share-locked like `coveringForShare`. */
  async closedOverlappingForShare(operationId: string, from: string, to: string, executor: Executor): Promise<SquareUp[]> {
    return executor
      .select()
      .from(squareUps)
      .where(and(eq(squareUps.operationId, operationId), eq(squareUps.status, 'closed'), lte(squareUps.periodFrom, to), gte(squareUps.periodTo, from)))
      .for('share');
  }

  /** The open period containing the day, else the latest open one. */
  async currentOpen(operationId: string, day: string): Promise<SquareUp | undefined> {
    const [row] = await this.dbh.db
      .select()
      .from(squareUps)
      .where(and(eq(squareUps.operationId, operationId), eq(squareUps.status, 'open')))
      .orderBy(sql`(${squareUps.periodFrom} <= ${day} and ${squareUps.periodTo} >= ${day}) desc`, desc(squareUps.periodFrom))
      .limit(1);
    return row;
  }

  async close(operationId: string, id: string, statement: SquareUpStatementDto, closedBy: string, executor: Executor): Promise<SquareUp> {
    const [row] = await executor
      .update(squareUps)
      .set({ status: 'closed', closedAt: new Date(statement.computedAt), closedBy, statement })
      .where(and(eq(squareUps.operationId, operationId), eq(squareUps.id, id)))
      .returning();
    return row!;
  }

  async insertTransfers(
    operationId: string,
    squareUpId: string,
    transfers: ReadonlyArray<{ position: number; fromPartyId: string; toPartyId: string; amount: string }>,
    executor: Executor,
  ): Promise<SquareUpTransfer[]> {
    if (transfers.length === 0) return [];
    return executor
      .insert(squareUpTransfers)
      .values(transfers.map((t) => ({ ...t, operationId, squareUpId })))
      .returning();
  }

  async transfers(operationId: string, squareUpId: string, executor: Executor = this.dbh.db): Promise<SquareUpTransfer[]> {
    return executor
      .select()
      .from(squareUpTransfers)
      .where(and(eq(squareUpTransfers.operationId, operationId), eq(squareUpTransfers.squareUpId, squareUpId)))
      .orderBy(asc(squareUpTransfers.position));
  }

  async findTransferForUpdate(operationId: string, squareUpId: string, transferId: string, executor: Executor): Promise<SquareUpTransfer | undefined> {
    const [row] = await executor
      .select()
      .from(squareUpTransfers)
      .where(and(eq(squareUpTransfers.operationId, operationId), eq(squareUpTransfers.squareUpId, squareUpId), eq(squareUpTransfers.id, transferId)))
      .for('update');
    return row;
  }

  async markTransferPaid(operationId: string, transferId: string, paid: TransferPaid, recordedBy: string, executor: Executor): Promise<SquareUpTransfer> {
    const [row] = await executor
      .update(squareUpTransfers)
      .set({ paidOn: paid.paidOn, method: paid.method, reference: paid.reference, recordedBy, recordedAt: new Date() })
      .where(and(eq(squareUpTransfers.operationId, operationId), eq(squareUpTransfers.id, transferId)))
      .returning();
    return row!;
  }
}
