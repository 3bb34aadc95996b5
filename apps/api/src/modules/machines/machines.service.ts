import { Inject, Injectable, type StreamableFile } from '@nestjs/common';
import { Decimal } from 'decimal.js';
import { FOREIGN_KEY_VIOLATION, pgErrorOf, type Executor } from '@hitchbook/db';
import { Dec } from '@hitchbook/shared/decimal';
import { machineClassOrThrow } from '@hitchbook/shared/machine-classes';
import type { Page } from '@hitchbook/shared/schemas/common';
import { machineRuleIssues, type MachineCreate, type MachineDto, type MachineListQuery, type MachineUpdate } from '@hitchbook/shared/schemas/machines';
import type { Actor } from '../../common/auth/actor.js';
import { csvDownload, type CsvColumn } from '../../common/csv/csv-writer.js';
import { AppError, conflict, forbidden, invalid } from '../../common/errors/app-error.js';
import { AuditService } from '../../core/audit.service.js';
import { DB, type DbHandle } from '../../core/database.js';
import { UploadsService } from '../uploads/uploads.service.js';
import { todayIso } from './calendar.js';
import { MachineAccess } from './machine-access.js';
import { toMachineDto } from './machine-dto.js';
import { MachinesRepository, type MachineValues } from './machines.repository.js';
import { MeterReadingsRepository } from './meter-readings.repository.js';
import { SharesRepository } from './shares.repository.js';
import { SharesService } from './shares.service.js';

const HAS_HISTORY = 'This machine has meter readings, costs or work logged; mark it sold or retired instead of deleting it.';

/** Request values as columns: decimals become exact strings, keys that were not sent stay out. */
function columnsOf(input: MachineUpdate): Partial<MachineValues> {
  const values: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(input)) values[key] = Decimal.isDecimal(value) ? value.toFixed() : value;
  if (input.classId) values.kind = machineClassOrThrow(input.classId).kind;
  return values as Partial<MachineValues>;
}

/** A fleet is dozens of machines; the cap only stops a runaway export. */
const EXPORT_MAX_MACHINES = 5_000;
const EXPORT_PAGE = 200;

const MACHINE_COLUMNS: CsvColumn<MachineDto>[] = [
  { header: 'name', value: (m) => m.name },
  { header: 'class', value: (m) => m.classLabel },
  { header: 'kind', value: (m) => m.kind },
  { header: 'status', value: (m) => m.status },
  { header: 'year', kind: 'number', value: (m) => m.year },
  { header: 'make', value: (m) => m.make },
  { header: 'model', value: (m) => m.model },
  { header: 'unit number', value: (m) => m.unitNumber },
  { header: 'serial number', value: (m) => m.serialNumber },
  { header: 'pto hp', kind: 'number', value: (m) => m.ptoHp },
  { header: 'fuel', value: (m) => m.fuelType },
  { header: 'owners', value: (m) => m.owners.map((o) => `${o.name} ${new Decimal(o.sharePct).toString()} %`).join('; ') },
  { header: 'hour meter', kind: 'number', value: (m) => m.lastReading?.hours },
];
const PRICE_COLUMNS: CsvColumn<MachineDto>[] = [
  { header: 'list price', kind: 'number', value: (m) => m.listPrice },
  { header: 'purchase price', kind: 'number', value: (m) => m.purchasePrice },
];

@Injectable()
export class MachinesService {
  constructor(
    @Inject(DB) private readonly dbh: DbHandle,
    @Inject(MachinesRepository) private readonly machines: MachinesRepository,
    @Inject(SharesRepository) private readonly shares: SharesRepository,
    @Inject(SharesService) private readonly sharesService: SharesService,
    @Inject(UploadsService) private readonly uploads: UploadsService,
    @Inject(MachineAccess) private readonly access: MachineAccess,
    @Inject(AuditService) private readonly audit: AuditService,
    @Inject(MeterReadingsRepository) private readonly readings: MeterReadingsRepository,
  ) {}

  async list(actor: Actor, query: MachineListQuery): Promise<Page<MachineDto>> {
    const today = todayIso();
    const { rows, total } = await this.machines.list(actor.operationId, query, today);
    const ids = rows.map((r) => r.id);
    const [owners, readings] = await Promise.all([this.shares.inForceOnForMachines(actor.operationId, ids, today), this.readings.latestOfMachines(actor.operationId, ids)]);
    const money = this.access.seesMoney(actor);
    return { items: rows.map((r) => toMachineDto(r, owners.get(r.id) ?? [], money, readings.get(r.id) ?? null)), total, page: query.page, pageSize: query.pageSize };
  }

  /** The filtered fleet table as CSV in the table's order; prices only for roles that see money. */
  async exportCsv(actor: Actor, query: MachineListQuery): Promise<StreamableFile> {
    const first = await this.list(actor, { ...query, page: 1, pageSize: EXPORT_PAGE });
    if (first.total > EXPORT_MAX_MACHINES) throw invalid('q', `More than ${EXPORT_MAX_MACHINES} machines match; narrow the filters.`);
    const list = (page: number) => this.list(actor, { ...query, page, pageSize: EXPORT_PAGE });
    async function* pages(): AsyncGenerator<MachineDto[]> {
      yield first.items;
      for (let page = 2; (page - 1) * EXPORT_PAGE < first.total; page++) yield (await list(page)).items;
    }
    const columns = this.access.seesMoney(actor) ? [...MACHINE_COLUMNS, ...PRICE_COLUMNS] : MACHINE_COLUMNS;
    return csvDownload(`machines-${todayIso()}.csv`, columns, pages());
  }

  async get(actor: Actor, id: string): Promise<MachineDto> {
    const machine = await this.access.machineOrThrow(actor, 'machine.read', id);
    const [owners, readings] = await Promise.all([this.shares.inForceOn(actor.operationId, id, todayIso()), this.readings.latestOfMachines(actor.operationId, [id])]);
    return toMachineDto(machine, owners, this.access.seesMoney(actor), readings.get(id) ?? null);
  }

  /**
   * The owner adds machines with any owners (or none yet). A partner adds machines its own household
   * holds a share of: named among the owners, or owning it outright when no owners are given.
   */
  async create(actor: Actor, input: MachineCreate): Promise<MachineDto> {
    const { owners, ...fields } = input;
    let lines = owners;
    if (actor.role === 'partner') {
      if (!actor.partyId) throw forbidden('Your sign-in is not tied to a household, so it cannot own a machine.');
      lines ??= [{ partyId: actor.partyId, sharePct: new Dec(100) }];
      if (!lines.some((l) => l.partyId === actor.partyId)) throw invalid('owners', 'Name your own household among the owners of a machine you add.');
    }
    const id = await this.write(async (tx) => {
      await this.photoOrThrow(actor, fields.photoUploadId, tx);
      const row = await this.machines.insert(actor.operationId, columnsOf(fields) as MachineValues, tx);
      if (lines) await this.sharesService.writeSetOrThrow(tx, actor, row.id, row.purchaseDate ?? todayIso(), lines, 'owners');
      await this.audit.record(this.audit.byActor(actor, 'machine.created', 'machine', row.id, { after: { ...row, owners: lines } }), tx);
      return row.id;
    });
    return this.get(actor, id);
  }

  async update(actor: Actor, id: string, patch: MachineUpdate): Promise<MachineDto> {
    await this.write(async (tx) => {
      const before = await this.access.machineOrThrow(actor, 'machine.change', id, tx);
      const issues = machineRuleIssues({ ...before, ...patch });
      if (issues.length > 0) throw new AppError('validation', 'Some fields need attention.', issues);
      await this.photoOrThrow(actor, patch.photoUploadId, tx);
      const after = await this.machines.update(actor.operationId, id, columnsOf(patch), tx);
      await this.audit.record(this.audit.byActor(actor, 'machine.updated', 'machine', id, { before, after }), tx);
      return id;
    });
    return this.get(actor, id);
  }

  /** Only a machine entered by mistake goes: one with readings, costs or work is sold or retired instead. */
  async delete(actor: Actor, id: string): Promise<void> {
    try {
      await this.dbh.db.transaction(async (tx) => {
        const before = await this.access.machineOrThrow(actor, 'machine.change', id, tx);
        if (await this.machines.hasHistory(actor.operationId, id, tx)) throw conflict(HAS_HISTORY);
        await this.machines.delete(actor.operationId, id, tx);
        await this.audit.record(this.audit.byActor(actor, 'machine.deleted', 'machine', id, { before }), tx);
      });
    } catch (err) {
      // A cost or entry logged in the moment between the check and the delete.
      if (pgErrorOf(err)?.code === FOREIGN_KEY_VIOLATION) throw conflict(HAS_HISTORY);
      throw err;
    }
  }

  private async photoOrThrow(actor: Actor, uploadId: string | null | undefined, tx: Executor): Promise<void> {
    if (uploadId) await this.uploads.requireOrThrow(actor.operationId, uploadId, 'machine-photo', 'photoUploadId', tx);
  }

  private async write(work: (tx: Executor) => Promise<string>): Promise<string> {
    try {
      return await this.dbh.db.transaction(work);
    } catch (err) {
      if (pgErrorOf(err)?.constraint === 'machines_photo_fk') throw invalid('photoUploadId', 'No such upload.');
      throw err;
    }
  }
}
