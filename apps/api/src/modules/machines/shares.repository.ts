import { Inject, Injectable } from '@nestjs/common';
import { and, asc, desc, eq, gte, inArray, lte, max, sql, sum } from 'drizzle-orm';
import { machineShares, parties, type Executor } from '@hitchbook/db';
import { DB, type DbHandle } from '../../core/database.js';

export interface ShareRow {
  machineId: string;
  partyId: string;
  partyName: string;
  /** numeric(7,4) as the database returns it, e.g. "66.6667". */
  sharePct: string;
  effectiveFrom: string;
}

export interface ShareLine {
  partyId: string;
  sharePct: string;
}

const shareColumns = {
  machineId: machineShares.machineId,
  partyId: machineShares.partyId,
  partyName: parties.name,
  sharePct: machineShares.sharePct,
  effectiveFrom: machineShares.effectiveFrom,
};

/**
 * Ownership shares by effective date. The set with the latest effective date on or before a day is
 * the ownership on that day. Every query is scoped by the operation id passed first.
 */
@Injectable()
export class SharesRepository {
  constructor(@Inject(DB) private readonly dbh: DbHandle) {}

  private partyJoin() {
    return and(eq(parties.operationId, machineShares.operationId), eq(parties.id, machineShares.partyId));
  }

  /** Every set of one machine, latest effective date first. */
  async history(operationId: string, machineId: string, executor: Executor = this.dbh.db): Promise<ShareRow[]> {
    return executor
      .select(shareColumns)
      .from(machineShares)
      .innerJoin(parties, this.partyJoin())
      .where(and(eq(machineShares.operationId, operationId), eq(machineShares.machineId, machineId)))
      .orderBy(desc(machineShares.effectiveFrom), desc(machineShares.sharePct), asc(parties.name));
  }

  /** The share set in force on a day (YYYY-MM-DD); empty before the machine's first set. */
  async inForceOn(operationId: string, machineId: string, day: string, executor: Executor = this.dbh.db): Promise<ShareRow[]> {
    return (await this.inForceOnForMachines(operationId, [machineId], day, executor)).get(machineId) ?? [];
  }

  /** The sets in force on a day for many machines at once, by machine id (for tables and square-ups). */
  async inForceOnForMachines(operationId: string, machineIds: readonly string[], day: string, executor: Executor = this.dbh.db): Promise<Map<string, ShareRow[]>> {
    const out = new Map<string, ShareRow[]>();
    if (machineIds.length === 0) return out;
    const latest = executor
      .select({ machineId: machineShares.machineId, effectiveFrom: max(machineShares.effectiveFrom).as('latest_effective_from') })
      .from(machineShares)
      .where(and(eq(machineShares.operationId, operationId), inArray(machineShares.machineId, [...machineIds]), lte(machineShares.effectiveFrom, day)))
      .groupBy(machineShares.machineId)
      .as('latest');
    const rows = await executor
      .select(shareColumns)
      .from(machineShares)
      .innerJoin(latest, and(eq(latest.machineId, machineShares.machineId), eq(latest.effectiveFrom, machineShares.effectiveFrom)))
      .innerJoin(parties, this.partyJoin())
      .where(eq(machineShares.operationId, operationId))
      .orderBy(desc(machineShares.sharePct), asc(parties.name));
    for (const row of rows) out.set(row.machineId, [...(out.get(row.machineId) ?? []), row]);
    return out;
  }

  /**
   * Whether a household holds a share in the set in force on the day or in any later-dated set:
   * a partner who is buying into a machine from next month may already look after it.
   */
  async holdsShare(operationId: string, machineId: string, partyId: string, day: string, executor: Executor = this.dbh.db): Promise<boolean> {
    const inForceSince = executor
      .select({ d: max(machineShares.effectiveFrom) })
      .from(machineShares)
      .where(and(eq(machineShares.operationId, operationId), eq(machineShares.machineId, machineId), lte(machineShares.effectiveFrom, day)));
    const [row] = await executor
      .select({ n: sql<number>`count(*)::int` })
      .from(machineShares)
      .where(
        and(
          eq(machineShares.operationId, operationId),
          eq(machineShares.machineId, machineId),
          eq(machineShares.partyId, partyId),
          gte(machineShares.effectiveFrom, sql`coalesce((${inForceSince}), '-infinity'::date)`),
        ),
      );
    return (row?.n ?? 0) > 0;
  }

  /** Replaces the set that starts on `effectiveFrom` (a correction) or adds it (a change of ownership). */
  async replaceSet(operationId: string, machineId: string, effectiveFrom: string, lines: readonly ShareLine[], createdBy: string | null, tx: Executor): Promise<void> {
    await tx
      .delete(machineShares)
      .where(and(eq(machineShares.operationId, operationId), eq(machineShares.machineId, machineId), eq(machineShares.effectiveFrom, effectiveFrom)));
    await tx.insert(machineShares).values(lines.map((line) => ({ operationId, machineId, effectiveFrom, partyId: line.partyId, sharePct: line.sharePct, createdBy })));
  }

  /** The stored total of one set, as the database adds it up. */
  async setTotal(operationId: string, machineId: string, effectiveFrom: string, tx: Executor): Promise<string> {
    const [row] = await tx
      .select({ total: sum(machineShares.sharePct) })
      .from(machineShares)
      .where(and(eq(machineShares.operationId, operationId), eq(machineShares.machineId, machineId), eq(machineShares.effectiveFrom, effectiveFrom)));
    return row?.total ?? '0';
  }
}
