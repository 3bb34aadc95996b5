import { createHash } from 'node:crypto';
import { Inject, Injectable } from '@nestjs/common';
import { Decimal } from 'decimal.js';
import type { Executor } from '@hitchbook/db';
import {
  FUEL_TICKET_IMPORT_COLUMNS,
  IMPORT_MAX_ROWS,
  WORK_ENTRY_IMPORT_COLUMNS,
  type ImportKind,
  type ImportReport,
  type ImportRowError,
} from '@hitchbook/shared/schemas/work-entries';
import type { Actor } from '../../common/auth/actor.js';
import { CsvFileError, readCsvTable, type CsvColumnSpec, type CsvDataRow } from '../../common/csv/csv-reader.js';
import { AppError, type FieldIssue } from '../../common/errors/app-error.js';
import { AuditService } from '../../core/audit.service.js';
import { DB, type DbHandle } from '../../core/database.js';
import { RateLimitService } from '../../core/rate-limit.service.js';
import { MachinesRepository } from '../machines/machines.repository.js';
import { SquareUpPeriods } from '../square-ups/square-up-periods.js';
import { FuelTicketsRepository } from './fuel-tickets.repository.js';
import type { EntryColumns } from './entry-draft.js';
import {
  importCatalogue,
  resolveEntryRow,
  resolveFuelRow,
  type EntryPreview,
  type FuelColumns,
  type FuelPreview,
  type ImportCatalogue,
  type ResolvedRow,
  type RowResult,
} from './import-rows.js';
import { entryReadingTime, fileMeterProblems, type ReadingPoint } from './meter-order.js';
import { ReferencesRepository } from './references.repository.js';
import { WorkEntriesRepository } from './work-entries.repository.js';

/** Imports are costly (a whole file parsed and checked): a member may run this many per window. */
const IMPORTS_PER_WINDOW = 30;
const IMPORT_WINDOW_SECONDS = 10 * 60;
/** Longest cell accepted; notes are the longest text an entry keeps. */
const MAX_CELL_LENGTH = 2000;
/**
 * Rows checked and written together: the file is read, checked and stored one batch at a time, so
 * only a batch of rows is ever held whole; well under PostgreSQL's 65,535 bind parameters.
 */
const IMPORT_BATCH = 500;

/** A resolved row with its import key. */
type Keyed<C, P> = ResolvedRow<C, P> & { key: string };

/** What the meter-order rule needs of a row; the whole file's worth is small. */
interface MeterPoint {
  row: number;
  machineId: string;
  workDate: string;
  meterEnd: string;
}

/** The first row of the file with an import key, and whether that key was stored before the import. */
interface FirstSeen {
  row: number;
  storedBefore: boolean;
}

/** A stored row whose meter reading is written once the whole file's meter order is known. */
type PendingReading = MeterPoint & { workEntryId: string };

interface Analysis<P> {
  total: number;
  errors: ImportRowError[];
  invalidRows: number;
  skippedRows: { row: number; reason: string }[];
  /** What a preview would create, or what a commit created. */
  rows: Array<{ row: number; preview: P }>;
}

/** What differs between importing work entries and fuel tickets. */
interface ImportPlan<C, P> {
  kind: ImportKind;
  columns: readonly CsvColumnSpec[];
  resolve: (row: CsvDataRow, catalogue: ImportCatalogue) => RowResult<C, P>;
  storedKeys: (operationId: string, keys: string[], executor: Executor) => Promise<Set<string>>;
  /** The row's meter end, for the rule that needs every row of the file at once. */
  meterPoint: (row: Keyed<C, P>) => MeterPoint | null;
  /** The day a row is dated on, which must not fall in a closed square-up. */
  dateOf: (columns: C) => string;
  /** Writes a batch and returns the id of each row stored, by import key. */
  write: (actor: Actor, batch: Keyed<C, P>[], tx: Executor) => Promise<Map<string, string>>;
  auditAction: string;
}

/** Where a commit writes as it reads; a preview has none. */
interface CommitSink {
  actor: Actor;
  tx: Executor;
  pendingReadings: PendingReading[];
}

export interface ImportOutcome {
  status: 200 | 400;
  body: ImportReport & { message?: string; issues?: FieldIssue[] };
}

/** Thrown inside the commit transaction so that nothing it wrote survives. */
class ImportRejected<P> extends Error {
  constructor(readonly analysis: Analysis<P>) {
    super('import rejected');
  }
}

/** The import key: the operation, the kind and the row's normalised content, hashed. */
export function importKeyOf(operationId: string, kind: ImportKind, keyParts: Array<string | null>): string {
  return createHash('sha256').update(JSON.stringify([operationId, kind, ...keyParts])).digest('hex');
}

@Injectable()
export class WorkEntriesImportService {
  private readonly entryPlan: ImportPlan<EntryColumns, EntryPreview>;
  private readonly fuelPlan: ImportPlan<FuelColumns, FuelPreview>;

  constructor(
    @Inject(DB) private readonly dbh: DbHandle,
    @Inject(WorkEntriesRepository) private readonly entries: WorkEntriesRepository,
    @Inject(FuelTicketsRepository) private readonly fuel: FuelTicketsRepository,
    @Inject(ReferencesRepository) private readonly refs: ReferencesRepository,
    @Inject(MachinesRepository) private readonly machines: MachinesRepository,
    @Inject(AuditService) private readonly audit: AuditService,
    @Inject(RateLimitService) private readonly limits: RateLimitService,
    @Inject(SquareUpPeriods) private readonly periods: SquareUpPeriods,
  ) {
    this.entryPlan = {
      kind: 'entries',
      columns: WORK_ENTRY_IMPORT_COLUMNS,
      resolve: resolveEntryRow,
      storedKeys: (op, keys, ex) => this.entries.existingImportKeys(op, keys, ex),
      meterPoint: ({ row, columns: c }) => (c.powerMachineId && c.meterEnd ? { row, machineId: c.powerMachineId, workDate: c.workDate, meterEnd: c.meterEnd } : null),
      dateOf: (c) => c.workDate,
      write: (actor, batch, tx) => this.writeEntries(actor, batch, tx),
      auditAction: 'work-entry.imported',
    };
    this.fuelPlan = {
      kind: 'fuel',
      columns: FUEL_TICKET_IMPORT_COLUMNS,
      resolve: resolveFuelRow,
      storedKeys: (op, keys, ex) => this.fuel.existingImportKeys(op, keys, ex),
      meterPoint: () => null,
      dateOf: (c) => c.incurredOn,
      write: async (actor, batch, tx) => {
        const inserted = await this.fuel.insertImported(actor.operationId, batch.map((r) => ({ ...r.columns, importKey: r.key, createdBy: actor.userId })), tx);
        return new Map(inserted.map((x) => [x.importKey!, x.id]));
      },
      auditAction: 'cost-entry.imported',
    };
  }

  run(actor: Actor, kind: ImportKind, mode: 'preview' | 'commit', file: Buffer): Promise<ImportOutcome> {
    return kind === 'entries' ? this.runPlan(this.entryPlan, actor, mode, file) : this.runPlan(this.fuelPlan, actor, mode, file);
  }

  /**
   * A preview reads and checks the file and writes nothing. A commit does the same inside one
   * transaction and writes every new row, or, when any row has an error, nothing at all.
   */
  private async runPlan<C, P>(plan: ImportPlan<C, P>, actor: Actor, mode: 'preview' | 'commit', file: Buffer): Promise<ImportOutcome> {
    const limit = await this.limits.hit(`work-import:${actor.userId}`, IMPORT_WINDOW_SECONDS, IMPORTS_PER_WINDOW + 1, IMPORT_WINDOW_SECONDS);
    if (limit.blockedForSeconds > 0) throw new AppError('throttled', 'Too many imports in a short time; wait a few minutes.', [], limit.blockedForSeconds);

    if (mode === 'preview') {
      const analysis = await this.analyse(plan, actor, file, this.dbh.db, null);
      return { status: 200, body: reportOf(plan.kind, mode, analysis) };
    }
    try {
      const body = await this.dbh.db.transaction(async (tx) => {
        const sink: CommitSink = { actor, tx, pendingReadings: [] };
        const analysis = await this.analyse(plan, actor, file, tx, sink);
        if (analysis.errors.length > 0) throw new ImportRejected(analysis);
        await this.audit.record(
          {
            operationId: actor.operationId,
            actorUserId: actor.userId,
            action: plan.auditAction,
            entityType: 'import',
            entityId: createHash('sha256').update(file).digest('hex'),
            after: { kind: plan.kind, total: analysis.total, created: analysis.rows.length, skipped: analysis.skippedRows.length },
          },
          tx,
        );
        return reportOf(plan.kind, mode, analysis);
      });
      return { status: 200, body };
    } catch (err) {
      if (!(err instanceof ImportRejected)) throw err;
      const report = reportOf(plan.kind, mode, { ...(err.analysis as Analysis<P>), rows: [] });
      const message = `Nothing was imported: ${report.invalid} row${report.invalid === 1 ? '' : 's'} need${report.invalid === 1 ? 's' : ''} attention.`;
      const issues = report.errors.map((e) => ({ path: `row ${e.row}${e.column ? `, ${e.column}` : ''}`, message: e.reason }));
      return { status: 400, body: { message, issues, ...report } };
    }
  }

  /**
   * Reads the file batch by batch: each batch is resolved, freed of rows stored before or repeated in
   * the file, checked against closed square-ups and, for a commit still without errors, written. A
   * commit with any error is rolled back by its caller, so writing early never keeps part of a file.
   */
  private async analyse<C, P>(plan: ImportPlan<C, P>, actor: Actor, file: Buffer, executor: Executor, sink: CommitSink | null): Promise<Analysis<P>> {
    const catalogue = importCatalogue(await this.refs.catalogue(actor.operationId, executor));
    const errors: ImportRowError[] = [];
    const skippedRows: { row: number; reason: string }[] = [];
    const rows: Array<{ row: number; preview: P }> = [];
    const firstRow = new Map<string, FirstSeen>();
    const closedDays = new Map<string, string | null>();
    const meterPoints: MeterPoint[] = [];
    let batch: Keyed<C, P>[] = [];

    const flush = async () => {
      const current = batch;
      batch = [];
      const fresh = await this.withoutDuplicates(plan, actor.operationId, current, firstRow, skippedRows, executor);
      errors.push(...(await this.closedPeriodProblems(plan, actor.operationId, fresh, closedDays, executor)));
      for (const r of fresh) {
        const point = plan.meterPoint(r);
        if (point) meterPoints.push(point);
      }
      if (!sink) {
        for (const r of fresh) rows.push({ row: r.row, preview: r.preview });
        return;
      }
      // Once a row has failed nothing will be kept; reading on only collects the other errors.
      if (errors.length > 0 || fresh.length === 0) return;
      const ids = await plan.write(sink.actor, fresh, sink.tx);
      for (const r of fresh) {
        const id = ids.get(r.key);
        // The database left out a row another upload stored a moment ago.
        if (id === undefined) {
          skippedRows.push({ row: r.row, reason: 'Imported by another upload just now; not stored twice.' });
          continue;
        }
        rows.push({ row: r.row, preview: r.preview });
        const point = plan.meterPoint(r);
        if (point) sink.pendingReadings.push({ ...point, workEntryId: id });
      }
    };

    let total: number;
    try {
      const read = await readCsvTable(file, { columns: plan.columns, maxRows: IMPORT_MAX_ROWS, maxFieldLength: MAX_CELL_LENGTH }, (row) => {
        const result = plan.resolve(row, catalogue);
        errors.push(...result.problems);
        if (result.resolved) batch.push({ ...result.resolved, key: importKeyOf(actor.operationId, plan.kind, result.resolved.keyParts) });
        return batch.length >= IMPORT_BATCH ? flush() : undefined;
      });
      total = read.rows;
    } catch (err) {
      if (err instanceof CsvFileError) throw new AppError('validation', err.message, [{ path: 'file', message: err.message }, ...err.details.map((d) => ({ path: 'file', message: d }))]);
      throw err;
    }
    if (total === 0) throw new AppError('validation', 'The file has a header but no rows.', [{ path: 'file', message: 'Add at least one row under the header.' }]);
    await flush();

    const { problems, offsets } = await this.meterProblems(actor.operationId, meterPoints, executor, sink !== null);
    errors.push(...problems);
    if (sink && errors.length === 0) await this.writeReadings(sink, offsets);
    // By row, then in the template's column order, as the person fixing the file reads it.
    const position = new Map(plan.columns.map((c, i) => [c.header, i]));
    errors.sort((a, b) => a.row - b.row || (position.get(a.column) ?? -1) - (position.get(b.column) ?? -1));
    return { total, errors, invalidRows: new Set(errors.map((e) => e.row)).size, skippedRows, rows };
  }

  /** Rows imported before, and rows repeated within the file, are skipped rather than stored again. */
  private async withoutDuplicates<C, P>(
    plan: ImportPlan<C, P>,
    operationId: string,
    rows: Keyed<C, P>[],
    firstRow: Map<string, FirstSeen>,
    skippedRows: { row: number; reason: string }[],
    executor: Executor,
  ): Promise<Keyed<C, P>[]> {
    // Keys met in earlier batches are not asked again: a commit has stored them in this transaction.
    const unseen = [...new Set(rows.map((r) => r.key))].filter((k) => !firstRow.has(k));
    const stored = await plan.storedKeys(operationId, unseen, executor);
    const fresh: Keyed<C, P>[] = [];
    for (const r of rows) {
      const earlier = firstRow.get(r.key);
      if (earlier?.storedBefore ?? stored.has(r.key)) skippedRows.push({ row: r.row, reason: 'Imported before; not stored twice.' });
      else if (earlier !== undefined) skippedRows.push({ row: r.row, reason: `Same as row ${earlier.row} of this file; stored once.` });
      else fresh.push(r);
      if (earlier === undefined) firstRow.set(r.key, { row: r.row, storedBefore: stored.has(r.key) });
    }
    return fresh;
  }

  private async closedPeriodProblems<C, P>(
    plan: ImportPlan<C, P>,
    operationId: string,
    rows: Keyed<C, P>[],
    closedDays: Map<string, string | null>,
    executor: Executor,
  ): Promise<ImportRowError[]> {
    const unchecked = [...new Set(rows.map((r) => plan.dateOf(r.columns)))].filter((d) => !closedDays.has(d));
    const closed = await this.periods.closedDaysAmong(operationId, unchecked, executor);
    for (const day of unchecked) closedDays.set(day, closed.get(day) ?? null);
    return rows.flatMap((r) => {
      const reason = closedDays.get(plan.dateOf(r.columns));
      return reason ? [{ row: r.row, column: 'date', reason }] : [];
    });
  }

  private async meterProblems(operationId: string, points: MeterPoint[], executor: Executor, lock: boolean) {
    const metered = points.map((p) => ({ row: p.row, machineId: p.machineId, workDate: p.workDate, meterEnd: new Decimal(p.meterEnd) }));
    const machineIds = [...new Set(metered.map((m) => m.machineId))].sort();
    // Same order in every transaction, so two imports touching the same machines cannot deadlock.
    if (lock) for (const id of machineIds) await this.machines.lock(operationId, id, executor);
    const readings = new Map<string, ReadingPoint[]>();
    for (const r of await this.refs.readingsOf(operationId, machineIds, executor)) readings.set(r.machineId, [...(readings.get(r.machineId) ?? []), r]);
    const { problems, offsets } = fileMeterProblems(metered, readings);
    return { problems: problems.map((p) => ({ row: p.row, column: 'meter end', reason: p.reason })), offsets };
  }

  private async writeEntries(actor: Actor, batch: Keyed<EntryColumns, EntryPreview>[], tx: Executor): Promise<Map<string, string>> {
    const now = new Date();
    // Imported entries wait for approval like any entry logged from the cab.
    const values = batch.map((r) => ({ ...r.columns, state: 'submitted' as const, submittedAt: now, importKey: r.key, createdBy: actor.userId }));
    const inserted = await this.entries.insertImported(actor.operationId, values, tx);
    return new Map(inserted.map((x) => [x.importKey!, x.id]));
  }

  /** Each stored entry's meter end, on the offset the file's meter order gave it. */
  private async writeReadings(sink: CommitSink, offsets: Map<number, string>): Promise<void> {
    const { actor, tx, pendingReadings } = sink;
    for (let i = 0; i < pendingReadings.length; i += IMPORT_BATCH) {
      const readings = pendingReadings.slice(i, i + IMPORT_BATCH).map((p) => ({
        machineId: p.machineId,
        workEntryId: p.workEntryId,
        readAt: entryReadingTime(p.workDate, null),
        hours: p.meterEnd,
        offsetHours: offsets.get(p.row) ?? '0',
        createdBy: actor.userId,
      }));
      await this.entries.insertMeterReadings(actor.operationId, readings, tx);
    }
  }
}

function reportOf<P>(kind: ImportKind, mode: 'preview' | 'commit', analysis: Analysis<P>): ImportReport {
  return {
    kind,
    mode,
    total: analysis.total,
    valid: analysis.total - analysis.invalidRows,
    invalid: analysis.invalidRows,
    skipped: analysis.skippedRows.length,
    created: mode === 'commit' ? analysis.rows.length : 0,
    errors: analysis.errors,
    skippedRows: [...analysis.skippedRows].sort((a, b) => a.row - b.row),
    rows: analysis.rows.map((r) => ({ row: r.row, ...(r.preview as Record<string, unknown>) })),
  };
}
