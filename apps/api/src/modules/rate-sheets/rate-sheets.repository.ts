import { Inject, Injectable } from '@nestjs/common';
import { and, asc, count, desc, eq, inArray, isNull, lte, or, type SQL } from 'drizzle-orm';
import {
  machineRates,
  machines,
  parties,
  rateSheetLines,
  rateSheets,
  workTypes,
  type Executor,
  type MachineRate,
  type NewRateSheet,
  type RateSheet,
  type RateSheetLine,
} from '@hitchbook/db';
import { DB, type DbHandle } from '../../core/database.js';

export interface LoadedSheet {
  sheet: RateSheet;
  partyName: string | null;
  lines: Array<RateSheetLine & { workTypeName: string }>;
  machineRates: Array<MachineRate & { machineName: string }>;
}

export interface RateSheetListFilter {
  relationship?: 'family' | 'neighbour' | 'agency';
  partyId?: string;
  includeArchived: boolean;
  sort: string;
  limit: number;
  offset: number;
}

export type SheetValues = Omit<NewRateSheet, 'id' | 'operationId' | 'createdAt' | 'updatedAt'>;
export type LineValues = Pick<RateSheetLine, 'workTypeId' | 'unit' | 'chargeType' | 'rate' | 'minimumCharge'>;
export type MachineRateValues = Pick<MachineRate, 'machineId' | 'ratePerHour'>;

const SORTS: Record<string, SQL[]> = {
  effectiveFrom: [asc(rateSheets.effectiveFrom)],
  '-effectiveFrom': [desc(rateSheets.effectiveFrom)],
  name: [asc(rateSheets.name)],
  '-name': [desc(rateSheets.name)],
};

/** Every query is scoped by the operation id passed first. */
@Injectable()
export class RateSheetsRepository {
  constructor(@Inject(DB) private readonly dbh: DbHandle) {}

  async list(operationId: string, filter: RateSheetListFilter): Promise<{ rows: Array<{ sheet: RateSheet; partyName: string | null; lineCount: number }>; total: number }> {
    const where = and(
      eq(rateSheets.operationId, operationId),
      filter.relationship ? eq(rateSheets.relationship, filter.relationship) : undefined,
      filter.partyId ? eq(rateSheets.partyId, filter.partyId) : undefined,
      filter.includeArchived ? undefined : isNull(rateSheets.archivedAt),
    );
    const lineCount = this.dbh.db
      .select({ sheetId: rateSheetLines.rateSheetId, n: count().as('n') })
      .from(rateSheetLines)
      .where(eq(rateSheetLines.operationId, operationId))
      .groupBy(rateSheetLines.rateSheetId)
      .as('line_count');
    const [rows, totals] = await Promise.all([
      this.dbh.db
        .select({ sheet: rateSheets, partyName: parties.name, lineCount: lineCount.n })
        .from(rateSheets)
        .leftJoin(parties, and(eq(parties.operationId, rateSheets.operationId), eq(parties.id, rateSheets.partyId)))
        .leftJoin(lineCount, eq(lineCount.sheetId, rateSheets.id))
        .where(where)
        .orderBy(...(SORTS[filter.sort] ?? SORTS['-effectiveFrom']!), asc(rateSheets.id))
        .limit(filter.limit)
        .offset(filter.offset),
      this.dbh.db.select({ n: count() }).from(rateSheets).where(where),
    ]);
    return { rows: rows.map((r) => ({ ...r, lineCount: Number(r.lineCount ?? 0) })), total: totals[0]?.n ?? 0 };
  }

  async find(operationId: string, id: string, executor: Executor = this.dbh.db): Promise<LoadedSheet | undefined> {
    const [row] = await executor
      .select({ sheet: rateSheets, partyName: parties.name })
      .from(rateSheets)
      .leftJoin(parties, and(eq(parties.operationId, rateSheets.operationId), eq(parties.id, rateSheets.partyId)))
      .where(and(eq(rateSheets.operationId, operationId), eq(rateSheets.id, id)));
    if (!row) return undefined;
    const [loaded] = await this.withLines(operationId, [row], executor);
    return loaded;
  }

  /**
   * The live sheets that may price this party's work up to a date: its own override sheets and the
   * sheets of its relationship. The choice per work date is then made by `sheetInForce`.
   */
  async liveSheetsFor(operationId: string, party: { id: string; relationship: RateSheet['relationship'] }, upTo: string, executor: Executor = this.dbh.db): Promise<LoadedSheet[]> {
    const rows = await executor
      .select({ sheet: rateSheets, partyName: parties.name })
      .from(rateSheets)
      .leftJoin(parties, and(eq(parties.operationId, rateSheets.operationId), eq(parties.id, rateSheets.partyId)))
      .where(
        and(
          eq(rateSheets.operationId, operationId),
          isNull(rateSheets.archivedAt),
          lte(rateSheets.effectiveFrom, upTo),
          or(eq(rateSheets.partyId, party.id), and(isNull(rateSheets.partyId), eq(rateSheets.relationship, party.relationship))),
        ),
      );
    return this.withLines(operationId, rows, executor);
  }

  async insert(operationId: string, values: SheetValues, executor: Executor): Promise<RateSheet> {
    const [row] = await executor.insert(rateSheets).values({ ...values, operationId }).returning();
    return row!;
  }

  async update(operationId: string, id: string, values: Partial<SheetValues>, executor: Executor): Promise<RateSheet | undefined> {
    const [row] = await executor
      .update(rateSheets)
      .set({ ...values, updatedAt: new Date() })
      .where(and(eq(rateSheets.operationId, operationId), eq(rateSheets.id, id)))
      .returning();
    return row;
  }

  async replaceLines(operationId: string, sheetId: string, lines: LineValues[], executor: Executor): Promise<void> {
    await executor.delete(rateSheetLines).where(and(eq(rateSheetLines.operationId, operationId), eq(rateSheetLines.rateSheetId, sheetId)));
    if (lines.length > 0) await executor.insert(rateSheetLines).values(lines.map((l) => ({ ...l, operationId, rateSheetId: sheetId })));
  }

  async replaceMachineRates(operationId: string, sheetId: string, rates: MachineRateValues[], executor: Executor): Promise<void> {
    await executor.delete(machineRates).where(and(eq(machineRates.operationId, operationId), eq(machineRates.rateSheetId, sheetId)));
    if (rates.length > 0) await executor.insert(machineRates).values(rates.map((r) => ({ ...r, operationId, rateSheetId: sheetId })));
  }

  async existingWorkTypeIds(operationId: string, ids: string[], executor: Executor): Promise<Set<string>> {
    if (ids.length === 0) return new Set();
    const rows = await executor.select({ id: workTypes.id }).from(workTypes).where(and(eq(workTypes.operationId, operationId), inArray(workTypes.id, ids)));
    return new Set(rows.map((r) => r.id));
  }

  async existingMachineIds(operationId: string, ids: string[], executor: Executor): Promise<Set<string>> {
    if (ids.length === 0) return new Set();
    const rows = await executor.select({ id: machines.id }).from(machines).where(and(eq(machines.operationId, operationId), inArray(machines.id, ids)));
    return new Set(rows.map((r) => r.id));
  }

  private async withLines(operationId: string, rows: Array<{ sheet: RateSheet; partyName: string | null }>, executor: Executor): Promise<LoadedSheet[]> {
    if (rows.length === 0) return [];
    const ids = rows.map((r) => r.sheet.id);
    // One after another: inside a transaction they share one connection.
    const lines = await executor
      .select({ line: rateSheetLines, workTypeName: workTypes.name })
      .from(rateSheetLines)
      .innerJoin(workTypes, and(eq(workTypes.operationId, rateSheetLines.operationId), eq(workTypes.id, rateSheetLines.workTypeId)))
      .where(and(eq(rateSheetLines.operationId, operationId), inArray(rateSheetLines.rateSheetId, ids)))
      .orderBy(asc(workTypes.name), asc(rateSheetLines.unit), asc(rateSheetLines.chargeType));
    const rates = await executor
      .select({ rate: machineRates, machineName: machines.name })
      .from(machineRates)
      .innerJoin(machines, and(eq(machines.operationId, machineRates.operationId), eq(machines.id, machineRates.machineId)))
      .where(and(eq(machineRates.operationId, operationId), inArray(machineRates.rateSheetId, ids)))
      .orderBy(asc(machines.name));
    return rows.map((r) => ({
      sheet: r.sheet,
      partyName: r.partyName,
      lines: lines.filter((l) => l.line.rateSheetId === r.sheet.id).map((l) => ({ ...l.line, workTypeName: l.workTypeName })),
      machineRates: rates.filter((m) => m.rate.rateSheetId === r.sheet.id).map((m) => ({ ...m.rate, machineName: m.machineName })),
    }));
  }
}
