import { Inject, Injectable, type StreamableFile } from '@nestjs/common';
import type { Decimal } from 'decimal.js';
import { pgErrorOf, type Executor, type NewField } from '@hitchbook/db';
import { fixed } from '@hitchbook/shared/decimal';
import type { Page } from '@hitchbook/shared/schemas/common';
import {
  fieldRuleIssues,
  type BoundaryGeometry,
  type FieldCreate,
  type FieldDto,
  type FieldListQuery,
  type FieldRuleSubject,
  type FieldUpdate,
} from '@hitchbook/shared/schemas/fields';
import { roadStripAcres } from '@hitchbook/shared/units';
import type { Actor } from '../../common/auth/actor.js';
import { csvDownload, type CsvColumn } from '../../common/csv/csv-writer.js';
import { AppError, invalid, notFound } from '../../common/errors/app-error.js';
import { AuditService } from '../../core/audit.service.js';
import { DB, type DbHandle } from '../../core/database.js';
import { PartiesRepository } from '../parties/parties.repository.js';
import { todayIso } from '../machines/calendar.js';
import { UploadsService } from '../uploads/uploads.service.js';
import { boundaryAcres } from './boundary-area.js';
import { FieldsRepository, type FieldListRow, type FieldRow } from './fields.repository.js';

type FieldValues = Omit<NewField, 'operationId' | 'id' | 'kind'>;

function toDto(row: FieldListRow | FieldRow): FieldDto {
  const dto: FieldDto = {
    id: row.id,
    kind: row.kind,
    name: row.name,
    acres: row.acres,
    boundaryAcres: row.boundaryAcres,
    hasBoundary: 'boundary' in row ? row.boundary !== null : row.hasBoundary,
    ownerPartyId: row.ownerPartyId,
    ownerName: row.ownerName,
    farmLabel: row.farmLabel,
    notes: row.notes,
    roadName: row.roadName,
    roadFrom: row.roadFrom,
    roadTo: row.roadTo,
    lengthMiles: row.lengthMiles,
    widthFt: row.widthFt,
    archived: row.archivedAt !== null,
    archivedAt: row.archivedAt?.toISOString() ?? null,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  };
  if ('boundary' in row) dto.boundary = row.boundary as BoundaryGeometry | null;
  return dto;
}

const dec = (value: Decimal | null | undefined) => (value === undefined ? undefined : value === null ? null : value.toFixed());

function ruleIssuesOrThrow(subject: FieldRuleSubject): void {
  const issues = fieldRuleIssues(subject);
  if (issues.length > 0) throw new AppError('validation', 'Some fields need attention.', issues);
}

/** A farm has hundreds of fields at most; the cap only stops a runaway export. */
const EXPORT_MAX_FIELDS = 5_000;
const EXPORT_PAGE = 200;

const FIELD_COLUMNS: CsvColumn<FieldDto>[] = [
  { header: 'name', value: (f) => f.name },
  { header: 'kind', value: (f) => f.kind },
  { header: 'acres', kind: 'number', value: (f) => f.acres },
  { header: 'boundary acres', kind: 'number', value: (f) => f.boundaryAcres },
  { header: 'owner', value: (f) => f.ownerName },
  { header: 'farm', value: (f) => f.farmLabel },
  { header: 'road', value: (f) => f.roadName },
  { header: 'from', value: (f) => f.roadFrom },
  { header: 'to', value: (f) => f.roadTo },
  { header: 'length miles', kind: 'number', value: (f) => f.lengthMiles },
  { header: 'width ft', kind: 'number', value: (f) => f.widthFt },
  { header: 'archived', value: (f) => (f.archived ? 'yes' : 'no') },
  { header: 'notes', value: (f) => f.notes },
];

@Injectable()
export class FieldsService {
  constructor(
    @Inject(DB) private readonly dbh: DbHandle,
    @Inject(FieldsRepository) private readonly repo: FieldsRepository,
    @Inject(PartiesRepository) private readonly parties: PartiesRepository,
    @Inject(UploadsService) private readonly uploads: UploadsService,
    @Inject(AuditService) private readonly audit: AuditService,
  ) {}

  async list(actor: Actor, query: FieldListQuery): Promise<Page<FieldDto>> {
    const { rows, total } = await this.repo.list(actor.operationId, query);
    return { items: rows.map(toDto), total, page: query.page, pageSize: query.pageSize };
  }

  /** The filtered fields table, fields and road stretches alike, as CSV in the table's order. */
  async exportCsv(actor: Actor, query: FieldListQuery): Promise<StreamableFile> {
    // A filter on a party the operation does not have is a wrong link, not an empty file.
    if (query.ownerPartyId && !(await this.parties.find(actor.operationId, query.ownerPartyId))) throw notFound('No such party.');
    const first = await this.list(actor, { ...query, page: 1, pageSize: EXPORT_PAGE });
    if (first.total > EXPORT_MAX_FIELDS) throw invalid('q', `More than ${EXPORT_MAX_FIELDS} fields match; narrow the filters.`);
    const list = (page: number) => this.list(actor, { ...query, page, pageSize: EXPORT_PAGE });
    async function* pages(): AsyncGenerator<FieldDto[]> {
      yield first.items;
      for (let page = 2; (page - 1) * EXPORT_PAGE < first.total; page++) yield (await list(page)).items;
    }
    return csvDownload(`fields-${todayIso()}.csv`, FIELD_COLUMNS, pages());
  }

  async get(actor: Actor, id: string): Promise<FieldDto> {
    const row = await this.repo.find(actor.operationId, id);
    if (!row) throw notFound('No such field.');
    return toDto(row);
  }

  async create(actor: Actor, input: FieldCreate): Promise<FieldDto> {
    const boundary = await this.boundaryOf(actor, input);
    const values: FieldValues = {
      name: input.name,
      // A road stretch's acres always follow from its strip; any acres sent for one are ignored.
      acres: input.kind === 'roadside' ? fixed(roadStripAcres(input.lengthMiles!, input.widthFt!), 3) : input.acres!.toFixed(),
      ownerPartyId: input.ownerPartyId ?? null,
      farmLabel: input.farmLabel ?? null,
      notes: input.notes ?? null,
      roadName: input.roadName ?? null,
      roadFrom: input.roadFrom ?? null,
      roadTo: input.roadTo ?? null,
      lengthMiles: dec(input.lengthMiles) ?? null,
      widthFt: dec(input.widthFt) ?? null,
      ...boundaryColumns(boundary ?? null, boundaryPath(input)),
    };
    return this.write(actor, async (tx) => {
      await this.ownerExistsOrThrow(actor, values.ownerPartyId, tx);
      const row = await this.repo.insert(actor.operationId, { kind: input.kind, ...values }, tx);
      await this.audit.record(this.audit.byActor(actor, 'field.created', 'field', row.id, { after: withoutBoundary(row) }), tx);
      return row.id;
    });
  }

  async update(actor: Actor, id: string, patch: FieldUpdate): Promise<FieldDto> {
    const boundary = await this.boundaryOf(actor, patch);
    return this.write(actor, async (tx) => {
      const before = await this.repo.find(actor.operationId, id, tx);
      if (!before) throw notFound('No such field.');
      const { archived, boundary: _inline, boundaryUploadId: _upload, acres, lengthMiles, widthFt, ...text } = patch;
      ruleIssuesOrThrow({ ...before, boundary: undefined, ...patch, kind: before.kind });
      const values: Partial<FieldValues> = { ...text, lengthMiles: dec(lengthMiles), widthFt: dec(widthFt) };
      if (before.kind === 'roadside') {
        values.acres = fixed(roadStripAcres(values.lengthMiles ?? before.lengthMiles!, values.widthFt ?? before.widthFt!), 3);
      } else if (acres !== undefined) {
        values.acres = acres.toFixed();
      }
      if (boundary !== undefined) Object.assign(values, boundaryColumns(boundary, boundaryPath(patch)));
      if (archived !== undefined) values.archivedAt = archived ? (before.archivedAt ?? new Date()) : null;
      await this.ownerExistsOrThrow(actor, values.ownerPartyId, tx);
      await this.repo.update(actor.operationId, id, values, tx);
      await this.audit.record(this.audit.byActor(actor, 'field.updated', 'field', id, { before: withoutBoundary(before), after: withoutBoundary(values) }), tx);
      return id;
    });
  }

  /** The boundary the request sets: inline, from an uploaded file, cleared (null) or untouched (undefined). */
  private async boundaryOf(actor: Actor, input: { boundary?: BoundaryGeometry | null; boundaryUploadId?: string }) {
    if (input.boundaryUploadId) return this.uploads.boundaryOrThrow(actor.operationId, input.boundaryUploadId, 'boundaryUploadId');
    return input.boundary;
  }

  private async ownerExistsOrThrow(actor: Actor, partyId: string | null | undefined, tx: Executor): Promise<void> {
    if (partyId && !(await this.parties.find(actor.operationId, partyId, tx))) throw invalid('ownerPartyId', 'No such party.');
  }

  private async write(actor: Actor, work: (tx: Executor) => Promise<string>): Promise<FieldDto> {
    let id: string;
    try {
      id = await this.dbh.db.transaction(work);
    } catch (err) {
      // A party deleted between the check and the write: still the caller's reference that is wrong.
      if (pgErrorOf(err)?.constraint === 'fields_owner_party_fk') throw invalid('ownerPartyId', 'No such party.');
      throw err;
    }
    return this.get(actor, id);
  }
}

const MAX_BOUNDARY_ACRES = 100_000;

const boundaryPath = (input: { boundaryUploadId?: string }) => (input.boundaryUploadId ? 'boundaryUploadId' : 'boundary');

/** Audit rows keep the boundary's acres, not its (possibly very long) coordinate list. */
function withoutBoundary<T extends { boundary?: unknown }>(row: T): Omit<T, 'boundary'> {
  const { boundary: _boundary, ...rest } = row;
  return rest;
}

function boundaryColumns(boundary: BoundaryGeometry | null, path: string): Pick<FieldValues, 'boundary' | 'boundaryAcres'> {
  if (boundary === null) return { boundary: null, boundaryAcres: null };
  const acres = boundaryAcres(boundary);
  if (acres.lte(0)) throw invalid(path, 'The boundary encloses no area.');
  // The same ceiling as typed acres: a ring drawn round the wrong way or round a continent is a mistake.
  if (acres.gt(MAX_BOUNDARY_ACRES)) throw invalid(path, `The boundary encloses ${fixed(acres, 0)} acres, more than the ${MAX_BOUNDARY_ACRES.toLocaleString('en-US')} a field may have; check its points.`);
  return { boundary, boundaryAcres: fixed(acres, 3) };
}
