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
/** Rows per INSERT: well under PostgreSQL's 65,535 bind parameters at twenty-odd columns a row. */
const INSERT_BATCH = 1000;

/** A resolved row with its import key; `meterOffset` is the offset its meter reading inherits. */
type Keyed<C, P> = ResolvedRow<C, P> & { key: string; meterOffset?: string };

interface Analysis<C, P> {
  total: number;
  errors: ImportRowError[];
  invalidRows: number;
  skippedRows: { row: number; reason: string }[];
  fresh: Keyed<C, P>[];
}

/** What differs between importing work entries and fuel tickets. */
interface ImportPlan<C, P> {
  kind: ImportKind;
  columns: readonly CsvColumnSpec[];
  resolve: (row: CsvDataRow, catalogue: ImportCatalogue) => RowResult<C, P>;
  storedKeys: (operationId: string, keys: string[], executor: Executor) => Promise<Set<string>>;
  /** Checks that need every row at once (the meter order); may lock what it checks against. */
  fileProblems: (operationId: string, rows: Keyed<C, P>[], executor: Executor, lock: boolean) => Promise<ImportRowError[]>;
  /** The day a row is dated on, which must not fall in a closed square-up. */
  dateOf: (columns: C) => string;
  /** Writes a batch and returns the id of each row stored, by import key. */
  write: (actor: Actor, batch: Keyed<C, P>[], tx: Executor) => Promise<Map<string, string>>;
  auditAction: string;
}

export interface ImportOutcome {
  status: 200 | 400;
  body: ImportReport & { message?: string; issues?: FieldIssue[] };
}

/** Thrown inside the commit transaction so that nothing it wrote survives. */
class ImportRejected<C, P> extends Error {
  constructor(readonly analysis: Analysis<C, P>) {
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
      fileProblems: (op, rows, ex, lock) => this.meterProblems(op, rows, ex, lock),
      dateOf: (c) => c.workDate,
      write: (actor, batch, tx) => this.writeEntries(actor, batch, tx),
      auditAction: 'work-entry.imported',
    };
    this.fuelPlan = {
      kind: 'fuel',
      columns: FUEL_TICKET_IMPORT_COLUMNS,
      resolve: resolveFuelRow,
      storedKeys: (op, keys, ex) => this.fuel.existingImportKeys(op, keys, ex),
      fileProblems: async () => [],
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
      const analysis = await this.analyse(plan, actor, file, this.dbh.db, false);
      return { status: 200, body: reportOf(plan.kind, mode, analysis, analysis.fresh) };
    }
    try {
      const body = await this.dbh.db.transaction(async (tx) => {
        const analysis = await this.analyse(plan, actor, file, tx, true);
        if (analysis.errors.length > 0) throw new ImportRejected(analysis);
        const created: Keyed<C, P>[] = [];
        for (let i = 0; i < analysis.fresh.length; i += INSERT_BATCH) {
          const batch = analysis.fresh.slice(i, i + INSERT_BATCH);
          const ids = await plan.write(actor, batch, tx);
          for (const r of batch) {
            // The database left out a row another upload stored a moment ago.
            if (ids.has(r.key)) created.push(r);
            else analysis.skippedRows.push({ row: r.row, reason: 'Imported by another upload just now; not stored twice.' });
          }
        }
        await this.audit.record(
          {
            operationId: actor.operationId,
            actorUserId: actor.userId,
            action: plan.auditAction,
            entityType: 'import',
            entityId: createHash('sha256').update(file).digest('hex'),
            after: { kind: plan.kind, total: analysis.total, created: created.length, skipped: analysis.skippedRows.length },
          },
          tx,
        );
        return reportOf(plan.kind, mode, analysis, created);
      });
      return { status: 200, body };
    } catch (err) {
      if (!(err instanceof ImportRejected)) throw err;
      const report = reportOf(plan.kind, mode, err.analysis as Analysis<C, P>, []);
      const message = `Nothing was imported: ${report.invalid} row${report.invalid === 1 ? '' : 's'} need${report.invalid === 1 ? 's' : ''} attention.`;
      const issues = report.errors.map((e) => ({ path: `row ${e.row}${e.column ? `, ${e.column}` : ''}`, message: e.reason }));
      return { status: 400, body: { message, issues, ...report } };
    }
  }

  private async analyse<C, P>(plan: ImportPlan<C, P>, actor: Actor, file: Buffer, executor: Executor, forCommit: boolean): Promise<Analysis<C, P>> {
    const catalogue = importCatalogue(await this.refs.catalogue(actor.operationId, executor));
    const results: RowResult<C, P>[] = [];
    let total: number;
    try {
      const read = await readCsvTable(file, { columns: plan.columns, maxRows: IMPORT_MAX_ROWS, maxFieldLength: MAX_CELL_LENGTH }, (row) => results.push(plan.resolve(row, catalogue)));
      total = read.rows;
    } catch (err) {
      if (err instanceof CsvFileError) throw new AppError('validation', err.message, [{ path: 'file', message: err.message }, ...err.details.map((d) => ({ path: 'file', message: d }))]);
      throw err;
    }
    if (total === 0) throw new AppError('validation', 'The file has a header but no rows.', [{ path: 'file', message: 'Add at least one row under the header.' }]);

    const errors = results.flatMap((r) => r.problems);
    const resolved = results.flatMap((r) => (r.resolved ? [{ ...r.resolved, key: importKeyOf(actor.operationId, plan.kind, r.resolved.keyParts) }] : []));
    const { fresh, skippedRows } = await this.withoutDuplicates(plan, actor.operationId, resolved, executor);
    errors.push(...(await plan.fileProblems(actor.operationId, fresh, executor, forCommit)));
    errors.push(...(await this.closedPeriodProblems(plan, actor.operationId, fresh, executor)));
    // By row, then in the template's column order, as the person fixing the file reads it.
    const position = new Map(plan.columns.map((c, i) => [c.header, i]));
    errors.sort((a, b) => a.row - b.row || (position.get(a.column) ?? -1) - (position.get(b.column) ?? -1));
    return { total, errors, invalidRows: new Set(errors.map((e) => e.row)).size, skippedRows, fresh };
  }

  /** Rows imported before, and rows repeated within the file, are skipped rather than stored again. */
  private async withoutDuplicates<C, P>(plan: ImportPlan<C, P>, operationId: string, rows: Keyed<C, P>[], executor: Executor) {
    const stored = new Set<string>();
    const keys = [...new Set(rows.map((r) => r.key))];
    for (let i = 0; i < keys.length; i += INSERT_BATCH) {
      for (const key of await plan.storedKeys(operationId, keys.slice(i, i + INSERT_BATCH), executor)) stored.add(key);
    }
    const firstRow = new Map<string, number>();
    const fresh: Keyed<C, P>[] = [];
    const skippedRows: { row: number; reason: string }[] = [];
    for (const r of rows) {
      const earlier = firstRow.get(r.key);
      if (stored.has(r.key)) skippedRows.push({ row: r.row, reason: 'Imported before; not stored twice.' });
      else if (earlier !== undefined) skippedRows.push({ row: r.row, reason: `Same as row ${earlier} of this file; stored once.` });
      else fresh.push(r);
      if (earlier === undefined) firstRow.set(r.key, r.row);
    }
    return { fresh, skippedRows };
  }

  private async closedPeriodProblems<C, P>(plan: ImportPlan<C, P>, operationId: string, rows: Keyed<C, P>[], executor: Executor): Promise<ImportRowError[]> {
    const closed = await this.periods.closedDaysAmong(operationId, [...new Set(rows.map((r) => plan.dateOf(r.columns)))], executor);
    return rows.flatMap((r) => {
      const reason = closed.get(plan.dateOf(r.columns));
      return reason ? [{ row: r.row, column: 'date', reason }] : [];
    });
  }

  private async meterProblems(operationId: string, rows: Keyed<EntryColumns, EntryPreview>[], executor: Executor, lock: boolean): Promise<ImportRowError[]> {
    const metered = rows.flatMap(({ row, columns: c }) =>
      c.powerMachineId && c.meterEnd ? [{ row, machineId: c.powerMachineId, workDate: c.workDate, meterEnd: new Decimal(c.meterEnd) }] : [],
    );
    const machineIds = [...new Set(metered.map((m) => m.machineId))].sort();
    // Same order in every transaction, so two imports touching the same machines cannot deadlock.
    if (lock) for (const id of machineIds) await this.machines.lock(operationId, id, executor);
    const readings = new Map<string, ReadingPoint[]>();
    for (const r of await this.refs.readingsOf(operationId, machineIds, executor)) readings.set(r.machineId, [...(readings.get(r.machineId) ?? []), r]);
    const { problems, offsets } = fileMeterProblems(metered, readings);
    for (const r of rows) r.meterOffset = offsets.get(r.row);
    return problems.map((p) => ({ row: p.row, column: 'meter end', reason: p.reason }));
  }

  private async writeEntries(actor: Actor, batch: Keyed<EntryColumns, EntryPreview>[], tx: Executor): Promise<Map<string, string>> {
    const now = new Date();
    // Imported entries wait for approval like any entry logged from the cab.
    const values = batch.map((r) => ({ ...r.columns, state: 'submitted' as const, submittedAt: now, importKey: r.key, createdBy: actor.userId }));
    const inserted = await this.entries.insertImported(actor.operationId, values, tx);
    const ids = new Map(inserted.map((x) => [x.importKey!, x.id]));
    const readings = batch.flatMap(({ key, columns: c, meterOffset }) => {
      const id = ids.get(key);
      return id && c.powerMachineId && c.meterEnd
        ? [{ machineId: c.powerMachineId, workEntryId: id, readAt: entryReadingTime(c.workDate, null), hours: c.meterEnd, offsetHours: meterOffset ?? '0', createdBy: actor.userId }]
        : [];
    });
    await this.entries.insertMeterReadings(actor.operationId, readings, tx);
    return ids;
  }
}

function reportOf<C, P>(kind: ImportKind, mode: 'preview' | 'commit', analysis: Analysis<C, P>, rows: Keyed<C, P>[]): ImportReport {
  return {
    kind,
    mode,
    total: analysis.total,
    valid: analysis.total - analysis.invalidRows,
    invalid: analysis.invalidRows,
    skipped: analysis.skippedRows.length,
    created: mode === 'commit' ? rows.length : 0,
    errors: analysis.errors,
    skippedRows: [...analysis.skippedRows].sort((a, b) => a.row - b.row),
    rows: rows.map((r) => ({ row: r.row, ...(r.preview as Record<string, unknown>) })),
  };
}
