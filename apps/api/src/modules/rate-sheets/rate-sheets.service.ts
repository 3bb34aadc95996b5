import { Inject, Injectable } from '@nestjs/common';
import { and, eq } from 'drizzle-orm';
import { parties, pgErrorOf, UNIQUE_VIOLATION, type Executor, type Party } from '@hitchbook/db';
import type { Page } from '@hitchbook/shared/schemas/common';
import type { RateSheetCreate, RateSheetDto, RateSheetInForceDto, RateSheetListItemDto, RateSheetListQuery, RateSheetUpdate } from '@hitchbook/shared/schemas/rate-sheets';
import type { Actor } from '../../common/auth/actor.js';
import { AppError, conflict, notFound, type FieldIssue } from '../../common/errors/app-error.js';
import { AuditService } from '../../core/audit.service.js';
import { DB, type DbHandle } from '../../core/database.js';
import { toRateSheetDto, toRateSheetListItem } from './rate-sheet.dto.js';
import { RateSheetsRepository, type LineValues, type MachineRateValues, type SheetValues } from './rate-sheets.repository.js';
import { sheetInForce } from './sheet-choice.js';

type SheetInput = Partial<RateSheetCreate>;

function sheetValues(input: SheetInput): Partial<SheetValues> {
  const out: Partial<SheetValues> = {};
  if (input.name !== undefined) out.name = input.name;
  if (input.relationship !== undefined) out.relationship = input.relationship;
  if (input.partyId !== undefined) out.partyId = input.partyId ?? null;
  if (input.effectiveFrom !== undefined) out.effectiveFrom = input.effectiveFrom;
  if (input.minimumCharge !== undefined) out.minimumCharge = input.minimumCharge.toFixed();
  if (input.minimumPer !== undefined) out.minimumPer = input.minimumPer;
  if (input.travelFlat !== undefined) out.travelFlat = input.travelFlat.toFixed();
  if (input.travelPerMile !== undefined) out.travelPerMile = input.travelPerMile.toFixed();
  if (input.fuelAdjustment !== undefined) {
    out.fuelBasePrice = input.fuelAdjustment?.basePricePerGallon.toFixed() ?? null;
    out.fuelStep = input.fuelAdjustment?.stepPerGallon.toFixed() ?? null;
    out.fuelAdjustPctPerStep = input.fuelAdjustment?.pctPerStep.toFixed() ?? null;
  }
  if (input.operatorWage !== undefined) out.operatorWage = input.operatorWage.toFixed();
  if (input.laborFactor !== undefined) out.laborFactor = input.laborFactor.toFixed();
  if (input.termsDays !== undefined) out.termsDays = input.termsDays;
  if (input.notes !== undefined) out.notes = input.notes;
  return out;
}

const lineValues = (lines: NonNullable<SheetInput['lines']>): LineValues[] =>
  lines.map((l) => ({ workTypeId: l.workTypeId, unit: l.unit, chargeType: l.chargeType, rate: l.rate.toFixed(), minimumCharge: l.minimumCharge?.toFixed() ?? null }));

const machineRateValues = (rates: NonNullable<SheetInput['machineRates']>): MachineRateValues[] =>
  rates.map((r) => ({ machineId: r.machineId, ratePerHour: r.ratePerHour.toFixed() }));

/** Owners write rate sheets; partners and bookkeepers read them. Issued invoices keep copies, so edits never reach them. */
@Injectable()
export class RateSheetsService {
  constructor(
    @Inject(DB) private readonly dbh: DbHandle,
    @Inject(RateSheetsRepository) private readonly repo: RateSheetsRepository,
    @Inject(AuditService) private readonly audit: AuditService,
  ) {}

  async list(actor: Actor, query: RateSheetListQuery): Promise<Page<RateSheetListItemDto>> {
    const { rows, total } = await this.repo.list(actor.operationId, {
      relationship: query.relationship,
      partyId: query.partyId,
      includeArchived: query.includeArchived,
      sort: query.sort,
      limit: query.pageSize,
      offset: (query.page - 1) * query.pageSize,
    });
    return { items: rows.map(toRateSheetListItem), total, page: query.page, pageSize: query.pageSize };
  }

  async get(actor: Actor, id: string): Promise<RateSheetDto> {
    const loaded = await this.repo.find(actor.operationId, id);
    if (!loaded) throw notFound('No such rate sheet.');
    return toRateSheetDto(loaded);
  }

  async inForce(actor: Actor, partyId: string, date: string): Promise<RateSheetInForceDto> {
    const party = await this.findParty(actor.operationId, partyId, this.dbh.db);
    if (!party) throw notFound('No such party.');
    const choice = sheetInForce(await this.repo.liveSheetsFor(actor.operationId, party, date), party, date, (l) => l.sheet);
    if (!choice) throw notFound(`No rate sheet is in force for ${party.name} on ${date}.`);
    return { source: choice.source, sheet: toRateSheetDto(choice.sheet) };
  }

  async create(actor: Actor, input: RateSheetCreate): Promise<RateSheetDto> {
    return this.write(async (tx) => {
      await this.checkReferencesOrThrow(actor.operationId, input, tx);
      const sheet = await this.repo.insert(actor.operationId, sheetValues(input) as SheetValues, tx);
      await this.repo.replaceLines(actor.operationId, sheet.id, lineValues(input.lines), tx);
      await this.repo.replaceMachineRates(actor.operationId, sheet.id, machineRateValues(input.machineRates), tx);
      const after = toRateSheetDto((await this.repo.find(actor.operationId, sheet.id, tx))!);
      await this.audit.record(this.audit.byActor(actor, 'rate-sheet.created', 'rate-sheet', sheet.id, { after }), tx);
      return after;
    });
  }

  async update(actor: Actor, id: string, input: RateSheetUpdate): Promise<RateSheetDto> {
    return this.write(async (tx) => {
      const loaded = await this.repo.find(actor.operationId, id, tx);
      if (!loaded) throw notFound('No such rate sheet.');
      const before = toRateSheetDto(loaded);
      await this.checkReferencesOrThrow(
        actor.operationId,
        { ...input, relationship: input.relationship ?? loaded.sheet.relationship, partyId: input.partyId !== undefined ? input.partyId : loaded.sheet.partyId },
        tx,
      );
      await this.repo.update(actor.operationId, id, sheetValues(input), tx);
      if (input.lines) await this.repo.replaceLines(actor.operationId, id, lineValues(input.lines), tx);
      if (input.machineRates) await this.repo.replaceMachineRates(actor.operationId, id, machineRateValues(input.machineRates), tx);
      const after = toRateSheetDto((await this.repo.find(actor.operationId, id, tx))!);
      await this.audit.record(this.audit.byActor(actor, 'rate-sheet.updated', 'rate-sheet', id, { before, after }), tx);
      return after;
    });
  }

  /** Archived sheets price nothing from now on; invoices priced with them keep their frozen lines. */
  async archive(actor: Actor, id: string): Promise<RateSheetDto> {
    return this.write(async (tx) => {
      const loaded = await this.repo.find(actor.operationId, id, tx);
      if (!loaded) throw notFound('No such rate sheet.');
      if (loaded.sheet.archivedAt) return toRateSheetDto(loaded);
      await this.repo.update(actor.operationId, id, { archivedAt: new Date() }, tx);
      const after = toRateSheetDto((await this.repo.find(actor.operationId, id, tx))!);
      await this.audit.record(this.audit.byActor(actor, 'rate-sheet.archived', 'rate-sheet', id, { before: toRateSheetDto(loaded), after }), tx);
      return after;
    });
  }

  /** One transaction per write; a second live sheet on the same start date is a conflict, named. */
  private async write<T>(work: (tx: Executor) => Promise<T>): Promise<T> {
    try {
      return await this.dbh.db.transaction(work);
    } catch (err) {
      if (pgErrorOf(err)?.code === UNIQUE_VIOLATION && pgErrorOf(err)?.constraint === 'rate_sheets_in_force_key') {
        throw conflict('Another live sheet for the same relationship (or party) already starts on that date; change its date or archive it first.');
      }
      throw err;
    }
  }

  private async findParty(operationId: string, id: string, executor: Executor): Promise<Party | undefined> {
    const [row] = await executor.select().from(parties).where(and(eq(parties.operationId, operationId), eq(parties.id, id)));
    return row;
  }

  /** Every id in the body must name a row of this operation; all misses are reported at once. */
  private async checkReferencesOrThrow(operationId: string, input: SheetInput, executor: Executor): Promise<void> {
    const issues: FieldIssue[] = [];
    if (input.partyId) {
      const party = await this.findParty(operationId, input.partyId, executor);
      if (!party) issues.push({ path: 'partyId', message: 'No such party.' });
      else if (input.relationship && party.relationship !== input.relationship) {
        issues.push({ path: 'relationship', message: `${party.name} is billed as ${party.relationship}; an override sheet for them must be a ${party.relationship} sheet.` });
      }
    }
    const workTypeIds = await this.repo.existingWorkTypeIds(operationId, [...new Set((input.lines ?? []).map((l) => l.workTypeId))], executor);
    input.lines?.forEach((l, i) => {
      if (!workTypeIds.has(l.workTypeId)) issues.push({ path: `lines.${i}.workTypeId`, message: 'No such work type.' });
    });
    const machineIds = await this.repo.existingMachineIds(operationId, [...new Set((input.machineRates ?? []).map((m) => m.machineId))], executor);
    input.machineRates?.forEach((m, i) => {
      if (!machineIds.has(m.machineId)) issues.push({ path: `machineRates.${i}.machineId`, message: 'No such machine.' });
    });
    if (issues.length > 0) throw new AppError('validation', 'Some fields need attention.', issues);
  }
}

