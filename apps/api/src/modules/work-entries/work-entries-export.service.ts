import { Inject, Injectable, type StreamableFile } from '@nestjs/common';
import type { WorkEntryFilter } from '@hitchbook/shared/schemas/work-entries';
import type { Actor } from '../../common/auth/actor.js';
import { csvDownload, type CsvColumn } from '../../common/csv/csv-writer.js';
import { AppError } from '../../common/errors/app-error.js';
import { RateLimitService } from '../../core/rate-limit.service.js';
import { listScopeOf } from './work-entries.service.js';
import { WorkEntriesRepository, type WorkEntryView } from './work-entries.repository.js';

/** More than a decade of a busy outfit's entries; beyond it the filters should narrow the export. */
export const EXPORT_MAX_ROWS = 100_000;
const EXPORT_BATCH = 500;
const EXPORTS_PER_WINDOW = 60;
const EXPORT_WINDOW_SECONDS = 10 * 60;

/** Free text (names, notes) is neutralised by the writer; quantities go out as plain numbers. */
const COLUMNS: CsvColumn<WorkEntryView>[] = [
  { header: 'date', value: (e) => e.workDate },
  { header: 'state', value: (e) => e.state },
  { header: 'operator', value: (e) => e.operatorName },
  { header: 'field', value: (e) => e.fieldName },
  { header: 'work type', value: (e) => e.workTypeName },
  { header: 'power unit', value: (e) => e.powerMachineName },
  { header: 'implement', value: (e) => e.implementMachineName },
  { header: 'start time', value: (e) => e.startedAt?.toISOString() },
  { header: 'end time', value: (e) => e.endedAt?.toISOString() },
  { header: 'meter start', kind: 'number', value: (e) => e.meterStart },
  { header: 'meter end', kind: 'number', value: (e) => e.meterEnd },
  { header: 'hours', kind: 'number', value: (e) => e.hours },
  { header: 'operator hours', kind: 'number', value: (e) => e.operatorHours },
  { header: 'acres', kind: 'number', value: (e) => e.acres },
  { header: 'miles', kind: 'number', value: (e) => e.miles },
  { header: 'loads', kind: 'number', value: (e) => e.loads },
  { header: 'each', kind: 'number', value: (e) => e.eachCount },
  { header: 'fuel gallons', kind: 'number', value: (e) => e.fuelGallons },
  { header: 'bill to', value: (e) => e.billToName },
  { header: 'notes', value: (e) => e.notes },
];

@Injectable()
export class WorkEntriesExportService {
  constructor(
    @Inject(WorkEntriesRepository) private readonly repo: WorkEntriesRepository,
    @Inject(RateLimitService) private readonly limits: RateLimitService,
  ) {}

  /** The filtered table as CSV, in the table's order, read in batches while it streams out. */
  async exportCsv(actor: Actor, filter: WorkEntryFilter): Promise<StreamableFile> {
    const limit = await this.limits.hit(`work-export:${actor.userId}`, EXPORT_WINDOW_SECONDS, EXPORTS_PER_WINDOW + 1, EXPORT_WINDOW_SECONDS);
    if (limit.blockedForSeconds > 0) throw new AppError('throttled', 'Too many exports in a short time; wait a few minutes.', [], limit.blockedForSeconds);
    const ids = await this.repo.matchingIds(actor.operationId, filter, listScopeOf(actor), EXPORT_MAX_ROWS + 1);
    if (ids.length > EXPORT_MAX_ROWS) {
      throw new AppError('validation', `More than ${EXPORT_MAX_ROWS} entries match; narrow the dates or filters.`, [{ path: 'dateFrom', message: 'Export a shorter period.' }]);
    }
    const repo = this.repo;
    async function* batches(): AsyncGenerator<WorkEntryView[]> {
      for (let i = 0; i < ids.length; i += EXPORT_BATCH) yield await repo.viewsByIds(actor.operationId, ids.slice(i, i + EXPORT_BATCH));
    }
    return csvDownload(`work-entries-${new Date().toISOString().slice(0, 10)}.csv`, COLUMNS, batches());
  }
}
