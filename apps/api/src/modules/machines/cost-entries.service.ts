import { Inject, Injectable, type StreamableFile } from '@nestjs/common';
import type { Decimal } from 'decimal.js';
import { pgErrorOf, type Executor } from '@hitchbook/db';
import { toMoneyString } from '@hitchbook/shared/money';
import {
  costEntryRuleIssues,
  type CostEntryCreate,
  type CostEntryDto,
  type CostEntryListQuery,
  type CostEntryPage,
  type CostEntryUpdate,
} from '@hitchbook/shared/schemas/machines';
import type { Actor } from '../../common/auth/actor.js';
import { csvDownload, type CsvColumn } from '../../common/csv/csv-writer.js';
import { AppError, invalid, notFound } from '../../common/errors/app-error.js';
import { AuditService } from '../../core/audit.service.js';
import { DB, type DbHandle } from '../../core/database.js';
import { PartiesRepository } from '../parties/parties.repository.js';
import { SquareUpPeriods } from '../square-ups/square-up-periods.js';
import { UploadsService } from '../uploads/uploads.service.js';
import { CostEntriesRepository, type CostEntryRow, type CostEntryValues } from './cost-entries.repository.js';
import { MachineAccess } from './machine-access.js';

function toDto(row: CostEntryRow): CostEntryDto {
  return {
    id: row.id,
    machineId: row.machineId,
    category: row.category,
    incurredOn: row.incurredOn,
    amount: row.amount,
    gallons: row.gallons,
    meterHours: row.meterHours,
    vendor: row.vendor,
    paidByPartyId: row.paidByPartyId,
    paidByName: row.paidByName,
    improvementLifeYears: row.improvementLifeYears,
    receiptUploadId: row.receiptUploadId,
    notes: row.notes,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  };
}

const dec = (value: Decimal | null | undefined) => (value === undefined ? undefined : value === null ? null : value.toFixed());

/** The patch as column values: decimals as exact strings, untouched keys left out. */
function columnsOf(input: CostEntryUpdate): Partial<CostEntryValues> {
  const { amount, gallons, meterHours, ...rest } = input;
  const values: Partial<CostEntryValues> = { ...rest };
  if (amount !== undefined) values.amount = amount.toFixed(2);
  if (gallons !== undefined) values.gallons = dec(gallons);
  if (meterHours !== undefined) values.meterHours = dec(meterHours);
  return values;
}

/** Decades of one machine's costs; a larger set is narrowed by dates first. */
export const COST_EXPORT_MAX_ROWS = 20_000;
const COST_EXPORT_PAGE = 200;

/** Free text (vendor, payer, notes) is neutralised by the writer; amounts go out as plain decimals. */
const COST_COLUMNS: CsvColumn<CostEntryRow>[] = [
  { header: 'date', value: (c) => c.incurredOn },
  { header: 'category', value: (c) => c.category },
  { header: 'amount', kind: 'number', value: (c) => c.amount },
  { header: 'gallons', kind: 'number', value: (c) => c.gallons },
  { header: 'meter hours', kind: 'number', value: (c) => c.meterHours },
  { header: 'vendor', value: (c) => c.vendor },
  { header: 'paid by', value: (c) => c.paidByName },
  { header: 'receipt', value: (c) => (c.receiptUploadId ? 'yes' : '') },
  { header: 'notes', value: (c) => c.notes },
];

@Injectable()
export class CostEntriesService {
  constructor(
    @Inject(DB) private readonly dbh: DbHandle,
    @Inject(CostEntriesRepository) private readonly costs: CostEntriesRepository,
    @Inject(PartiesRepository) private readonly parties: PartiesRepository,
    @Inject(UploadsService) private readonly uploads: UploadsService,
    @Inject(MachineAccess) private readonly access: MachineAccess,
    @Inject(AuditService) private readonly audit: AuditService,
    @Inject(SquareUpPeriods) private readonly periods: SquareUpPeriods,
  ) {}

  async list(actor: Actor, machineId: string, query: CostEntryListQuery): Promise<CostEntryPage> {
    await this.access.machineOrThrow(actor, 'money.read', machineId);
    const { rows, total, amount, gallons } = await this.costs.list(actor.operationId, machineId, query);
    return { items: rows.map(toDto), total, page: query.page, pageSize: query.pageSize, totals: { amount: toMoneyString(amount), gallons } };
  }

  /** The filtered costs table, every page of it in the table's order, as CSV. */
  async exportCsv(actor: Actor, machineId: string, query: CostEntryListQuery): Promise<StreamableFile> {
    const machine = await this.access.machineOrThrow(actor, 'money.read', machineId);
    const first = await this.costs.list(actor.operationId, machineId, { ...query, page: 1, pageSize: COST_EXPORT_PAGE });
    if (first.total > COST_EXPORT_MAX_ROWS) {
      throw new AppError('validation', `More than ${COST_EXPORT_MAX_ROWS} costs match; narrow the dates.`, [{ path: 'from', message: 'Export a shorter period.' }]);
    }
    const costs = this.costs;
    async function* pages(): AsyncGenerator<CostEntryRow[]> {
      yield first.rows;
      for (let page = 2; (page - 1) * COST_EXPORT_PAGE < first.total; page++) {
        yield (await costs.list(actor.operationId, machineId, { ...query, page, pageSize: COST_EXPORT_PAGE })).rows;
      }
    }
    const slug = machine.name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'machine';
    return csvDownload(`costs-${slug}-${new Date().toISOString().slice(0, 10)}.csv`, COST_COLUMNS, pages());
  }

  async get(actor: Actor, machineId: string, id: string): Promise<CostEntryDto> {
    await this.access.machineOrThrow(actor, 'money.read', machineId);
    const row = await this.costs.find(actor.operationId, machineId, id);
    if (!row) throw notFound('No such cost entry.');
    return toDto(row);
  }

  async create(actor: Actor, machineId: string, input: CostEntryCreate): Promise<CostEntryDto> {
    const id = await this.write(async (tx) => {
      await this.access.machineOrThrow(actor, 'machine.change', machineId, tx);
      await this.referencesOrThrow(actor, input, tx);
      await this.periods.assertPeriodOpenOrThrow(actor.operationId, input.incurredOn, tx);
      const row = await this.costs.insert(
        actor.operationId,
        machineId,
        { ...(columnsOf(input) as CostEntryValues), createdBy: actor.userId },
        tx,
      );
      await this.audit.record(this.audit.byActor(actor, 'cost-entry.created', 'cost-entry', row.id, { after: row }), tx);
      return row.id;
    });
    return this.get(actor, machineId, id);
  }

  async update(actor: Actor, machineId: string, id: string, patch: CostEntryUpdate): Promise<CostEntryDto> {
    await this.write(async (tx) => {
      await this.access.machineOrThrow(actor, 'machine.change', machineId, tx);
      const before = await this.costs.find(actor.operationId, machineId, id, tx);
      if (!before) throw notFound('No such cost entry.');
      const issues = costEntryRuleIssues({ ...before, ...patch });
      if (issues.length > 0) throw new AppError('validation', 'Some fields need attention.', issues);
      await this.referencesOrThrow(actor, patch, tx);
      // A cost may neither leave nor enter a closed square-up: both would change a frozen statement.
      await this.periods.assertPeriodOpenOrThrow(actor.operationId, before.incurredOn, tx);
      if (patch.incurredOn) await this.periods.assertPeriodOpenOrThrow(actor.operationId, patch.incurredOn, tx);
      const values = columnsOf(patch);
      await this.costs.update(actor.operationId, machineId, id, values, tx);
      await this.audit.record(this.audit.byActor(actor, 'cost-entry.updated', 'cost-entry', id, { before, after: values }), tx);
      return id;
    });
    return this.get(actor, machineId, id);
  }

  async delete(actor: Actor, machineId: string, id: string): Promise<void> {
    await this.write(async (tx) => {
      await this.access.machineOrThrow(actor, 'machine.change', machineId, tx);
      const before = await this.costs.find(actor.operationId, machineId, id, tx);
      if (!before) throw notFound('No such cost entry.');
      await this.periods.assertPeriodOpenOrThrow(actor.operationId, before.incurredOn, tx);
      await this.costs.delete(actor.operationId, machineId, id, tx);
      await this.audit.record(this.audit.byActor(actor, 'cost-entry.deleted', 'cost-entry', id, { before }), tx);
      return id;
    });
  }

  /** The payer is a household of this operation; a receipt is this operation's receipt upload. */
  private async referencesOrThrow(actor: Actor, input: { paidByPartyId?: string; receiptUploadId?: string | null }, tx: Executor): Promise<void> {
    if (input.paidByPartyId) {
      const party = await this.parties.find(actor.operationId, input.paidByPartyId, tx);
      if (!party) throw invalid('paidByPartyId', 'No such party.');
      if (party.kind !== 'household') throw invalid('paidByPartyId', `${party.name} is a customer; costs are paid by a household.`);
    }
    if (input.receiptUploadId) await this.uploads.requireOrThrow(actor.operationId, input.receiptUploadId, 'receipt', 'receiptUploadId', tx);
  }

  private async write(work: (tx: Executor) => Promise<string>): Promise<string> {
    try {
      return await this.dbh.db.transaction(work);
    } catch (err) {
      // References that vanished between the check and the write are still the caller's to fix.
      const constraint = pgErrorOf(err)?.constraint;
      if (constraint === 'cost_entries_paid_by_fk') throw invalid('paidByPartyId', 'No such party.');
      if (constraint === 'cost_entries_receipt_fk') throw invalid('receiptUploadId', 'No such upload.');
      throw err;
    }
  }
}
