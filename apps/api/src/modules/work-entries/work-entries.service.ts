import { Inject, Injectable } from '@nestjs/common';
import { Decimal } from 'decimal.js';
import { pgErrorOf, UNIQUE_VIOLATION, type Executor, type NewWorkEntry, type WorkEntry } from '@hitchbook/db';
import type {
  WorkEntryCreateInput,
  WorkEntryListQuery,
  WorkEntryPage,
  WorkEntryTransitionInput,
  WorkEntryUpdateInput,
  WorkEntryWarning,
  WorkEntryWithWarnings,
} from '@hitchbook/shared/schemas/work-entries';
import { plausibilityWarnings, type CheckedEntry } from '@hitchbook/shared/work-entry-checks';
import type { Actor } from '../../common/auth/actor.js';
import { AppError, conflict, notFound, type FieldIssue } from '../../common/errors/app-error.js';
import { AuditService } from '../../core/audit.service.js';
import { DB, type DbHandle } from '../../core/database.js';
import { constraintError } from './constraint-errors.js';
import { completeDraft, draftFromCreate, draftFromUpdate, type EntryColumns, type EntryDraft, type FieldDefaults } from './entry-draft.js';
import { requireEntryAccess, type EntryAction } from './entry-access.js';
import { EntryPhotosService } from './entry-photos.service.js';
import { FieldsRepository } from '../fields/fields.repository.js';
import { MachinesRepository } from '../machines/machines.repository.js';
import { MeterReadingsRepository } from '../machines/meter-readings.repository.js';
import { MeterReadingsService } from '../machines/meter-readings.service.js';
import { PartiesRepository } from '../parties/parties.repository.js';
import { SquareUpPeriods } from '../square-ups/square-up-periods.js';
import { WorkTypesRepository } from '../work-types/work-types.repository.js';
import { entryReadingTime } from './meter-order.js';
import { ReferencesRepository } from './references.repository.js';
import { toWorkEntryDto } from './work-entry.dto.js';
import { WorkEntriesRepository, type ListScope } from './work-entries.repository.js';

const validation = (issues: FieldIssue[]) => new AppError('validation', 'Some fields need attention.', issues);

/** An operator lists and exports only their own entries; everyone else the whole operation's. */
export function listScopeOf(actor: Actor): ListScope {
  return actor.role === 'operator' ? { operatorUserId: actor.userId } : {};
}

@Injectable()
export class WorkEntriesService {
  constructor(
    @Inject(DB) private readonly dbh: DbHandle,
    @Inject(WorkEntriesRepository) private readonly repo: WorkEntriesRepository,
    @Inject(ReferencesRepository) private readonly refs: ReferencesRepository,
    @Inject(FieldsRepository) private readonly fields: FieldsRepository,
    @Inject(WorkTypesRepository) private readonly workTypes: WorkTypesRepository,
    @Inject(PartiesRepository) private readonly parties: PartiesRepository,
    @Inject(MachinesRepository) private readonly machines: MachinesRepository,
    @Inject(MeterReadingsRepository) private readonly readings: MeterReadingsRepository,
    @Inject(MeterReadingsService) private readonly meter: MeterReadingsService,
    @Inject(AuditService) private readonly audit: AuditService,
    @Inject(SquareUpPeriods) private readonly periods: SquareUpPeriods,
    @Inject(EntryPhotosService) private readonly photos: EntryPhotosService,
  ) {}

  async list(actor: Actor, query: WorkEntryListQuery): Promise<WorkEntryPage> {
    const { page, pageSize, ...filter } = query;
    const { rows, total, totals } = await this.repo.list(actor.operationId, filter, listScopeOf(actor), { limit: pageSize, offset: (page - 1) * pageSize });
    return { items: rows.map(toWorkEntryDto), total, page, pageSize, totals };
  }

  async get(actor: Actor, id: string): Promise<WorkEntryWithWarnings> {
    return this.present(actor, id);
  }

  /** Logs an entry; a resend with the same clientId returns the stored one (`created: false`). */
  async create(actor: Actor, input: WorkEntryCreateInput): Promise<{ entry: WorkEntryWithWarnings; created: boolean }> {
    if (input.clientId) {
      const resent = await this.resent(actor, input.clientId);
      if (resent) return { entry: resent, created: false };
    }
    const operatorUserId = this.operatorOrThrow(actor, input.operatorUserId);
    try {
      const id = await this.dbh.db.transaction(async (tx) => {
        const draft = draftFromCreate(input, operatorUserId);
        await this.periods.assertPeriodOpenOrThrow(actor.operationId, draft.workDate, tx);
        const { field } = await this.resolveReferences(actor.operationId, draft, null, tx);
        const columns = await this.completeOrThrow(actor.operationId, draft, field, tx);
        const submitted = input.state === 'submitted';
        const row = await this.repo.insert(
          actor.operationId,
          { ...columns, clientId: input.clientId ?? null, state: input.state, submittedAt: submitted ? new Date() : null, createdBy: actor.userId },
          tx,
        );
        await this.recordMeterOrThrow(actor, row, tx);
        await this.audit.record(this.audit.byActor(actor, 'work-entry.created', 'work-entry', row.id, { after: row }), tx);
        return row.id;
      });
      return { entry: await this.present(actor, id), created: true };
    } catch (err) {
      // Two sends of the same entry raced: the other one stored it, so this one returns it.
      const pg = pgErrorOf(err);
      if (input.clientId && pg?.code === UNIQUE_VIOLATION && pg.constraint === 'work_entries_operation_client_id_key') {
        const resent = await this.resent(actor, input.clientId);
        if (resent) return { entry: resent, created: false };
      }
      throw constraintError(err) ?? err;
    }
  }

  async update(actor: Actor, id: string, patch: WorkEntryUpdateInput): Promise<WorkEntryWithWarnings> {
    try {
      await this.dbh.db.transaction(async (tx) => {
        const locked = await this.lockOrThrow(actor, id, 'edit', tx);
        versionOrThrow(locked, patch.version);
        if (patch.operatorUserId !== undefined && patch.operatorUserId !== locked.operatorUserId) this.operatorOrThrow(actor, patch.operatorUserId);
        const oldField = await this.fields.find(actor.operationId, locked.fieldId, tx);
        const draft = draftFromUpdate(locked, patch, oldField);
        // An entry may neither leave nor enter a closed square-up: both would change a final statement.
        await this.periods.assertPeriodOpenOrThrow(actor.operationId, locked.workDate, tx);
        if (draft.workDate !== locked.workDate) await this.periods.assertPeriodOpenOrThrow(actor.operationId, draft.workDate, tx);
        const { field } = await this.resolveReferences(actor.operationId, draft, locked, tx);
        // The entry's own earlier reading is replaced, so it is neither its default start nor its neighbour.
        await this.repo.deleteMeterReadingOf(actor.operationId, id, tx);
        const columns = await this.completeOrThrow(actor.operationId, draft, field, tx);
        const after = await this.repo.update(actor.operationId, id, columns, tx);
        await this.recordMeterOrThrow(actor, after, tx);
        await this.audit.record(this.audit.byActor(actor, 'work-entry.updated', 'work-entry', id, { before: locked, after }), tx);
      });
    } catch (err) {
      throw constraintError(err) ?? err;
    }
    return this.present(actor, id);
  }

  submit(actor: Actor, id: string, body: WorkEntryTransitionInput): Promise<WorkEntryWithWarnings> {
    return this.transition(actor, id, 'submit', body, () => ({ state: 'submitted', submittedAt: new Date() }));
  }

  approve(actor: Actor, id: string, body: WorkEntryTransitionInput): Promise<WorkEntryWithWarnings> {
    return this.transition(actor, id, 'approve', body, () => ({ state: 'approved', approvedAt: new Date(), approvedBy: actor.userId }));
  }

  /** Back to submitted, so it can be corrected; the audit log keeps what it was when approved. */
  reopen(actor: Actor, id: string, body: WorkEntryTransitionInput): Promise<WorkEntryWithWarnings> {
    return this.transition(actor, id, 'reopen', body, () => ({ state: 'submitted', approvedAt: null, approvedBy: null }));
  }

  async remove(actor: Actor, id: string): Promise<void> {
    const photoFiles = await this.dbh.db.transaction(async (tx) => {
      const locked = await this.lockOrThrow(actor, id, 'delete', tx);
      await this.periods.assertPeriodOpenOrThrow(actor.operationId, locked.workDate, tx);
      const files = await this.photos.deleteAllOf(actor.operationId, id, tx);
      await this.repo.delete(actor.operationId, id, tx);
      await this.audit.record(this.audit.byActor(actor, 'work-entry.deleted', 'work-entry', id, { before: locked }), tx);
      return files;
    });
    await this.photos.discardFiles(photoFiles);
  }

  private async transition(
    actor: Actor,
    id: string,
    action: Extract<EntryAction, 'submit' | 'approve' | 'reopen'>,
    body: WorkEntryTransitionInput,
    change: () => Partial<NewWorkEntry>,
  ): Promise<WorkEntryWithWarnings> {
    await this.dbh.db.transaction(async (tx) => {
      const locked = await this.lockOrThrow(actor, id, action, tx);
      if (body.version !== undefined) versionOrThrow(locked, body.version);
      await this.periods.assertPeriodOpenOrThrow(actor.operationId, locked.workDate, tx);
      const after = await this.repo.update(actor.operationId, id, change(), tx);
      const verb = action === 'submit' ? 'submitted' : action === 'approve' ? 'approved' : 'reopened';
      await this.audit.record(this.audit.byActor(actor, `work-entry.${verb}`, 'work-entry', id, { before: locked, after }), tx);
    });
    return this.present(actor, id);
  }

  private async lockOrThrow(actor: Actor, id: string, action: EntryAction, tx: Executor): Promise<WorkEntry> {
    const locked = await this.repo.lockForChange(actor.operationId, id, tx);
    if (!locked) throw notFound('No such work entry.');
    requireEntryAccess(actor, action, locked.entry, locked.onInvoice);
    return locked.entry;
  }

  private async resent(actor: Actor, clientId: string): Promise<WorkEntryWithWarnings | null> {
    const existing = await this.repo.findByClientId(actor.operationId, clientId);
    if (!existing) return null;
    if (actor.role === 'operator' && existing.operatorUserId !== actor.userId) throw conflict('This clientId belongs to another entry; generate a new one.');
    return this.present(actor, existing.id);
  }

  /** The member the entry is logged for: the caller unless an owner or partner names someone else. */
  private operatorOrThrow(actor: Actor, requested: string | undefined): string {
    if (requested === undefined || requested === actor.userId) return actor.userId;
    if (actor.role === 'operator') {
      throw new AppError('forbidden', 'An operator logs work only as themselves.', [{ path: 'operatorUserId', message: 'Leave it out or use your own id.' }]);
    }
    return requested;
  }

  /** Every id in the entry must name a row of this operation that fits its place; all problems at once. */
  private async resolveReferences(operationId: string, draft: EntryDraft, existing: WorkEntry | null, tx: Executor): Promise<{ field: FieldDefaults }> {
    const changed = (key: 'fieldId' | 'workTypeId' | 'billToPartyId' | 'operatorUserId') => !existing || existing[key] !== draft[key];
    // One after another: the queries share the transaction's single connection.
    const field = await this.fields.find(operationId, draft.fieldId, tx);
    const workType = await this.workTypes.find(operationId, draft.workTypeId, tx);
    const party = await this.parties.find(operationId, draft.billToPartyId, tx);
    const operator = changed('operatorUserId') ? await this.refs.operator(operationId, draft.operatorUserId, tx) : true;
    const power = draft.powerMachineId ? await this.machines.find(operationId, draft.powerMachineId, tx) : null;
    const implement = draft.implementMachineId ? await this.machines.find(operationId, draft.implementMachineId, tx) : null;
    const issues: FieldIssue[] = [];
    if (!field) issues.push({ path: 'fieldId', message: 'No such field or road stretch in this operation.' });
    else if (field.archivedAt && changed('fieldId')) issues.push({ path: 'fieldId', message: `${field.name} is archived; pick a field in use.` });
    if (!workType) issues.push({ path: 'workTypeId', message: 'No such work type in this operation.' });
    else if (workType.archived && changed('workTypeId')) issues.push({ path: 'workTypeId', message: `${workType.name} is archived; pick a work type in use.` });
    if (!party) issues.push({ path: 'billToPartyId', message: 'No such household or customer in this operation.' });
    else if (party.archivedAt && changed('billToPartyId')) issues.push({ path: 'billToPartyId', message: `${party.name} is archived; pick another party.` });
    if (!operator) issues.push({ path: 'operatorUserId', message: 'Not an owner, partner or operator of this operation.' });
    if (draft.powerMachineId && !power) issues.push({ path: 'powerMachineId', message: 'No such machine in this operation.' });
    else if (power && power.kind === 'implement') issues.push({ path: 'powerMachineId', message: `${power.name} is an implement; pick a tractor or self-propelled machine.` });
    if (draft.implementMachineId && !implement) issues.push({ path: 'implementMachineId', message: 'No such machine in this operation.' });
    else if (implement && implement.kind !== 'implement') issues.push({ path: 'implementMachineId', message: `${implement.name} is a power unit, not an implement.` });
    if (issues.length > 0 || !field) throw validation(issues);
    return { field };
  }

  /**
   * Fills the defaults. A meter end takes its start from the power unit's last reading, read after
   * locking the machine so a concurrent entry cannot take the same one.
   */
  private async completeOrThrow(operationId: string, draft: EntryDraft, field: FieldDefaults, tx: Executor): Promise<EntryColumns> {
    let lastReading: string | undefined;
    if (draft.powerMachineId && draft.meterEnd) {
      await this.machines.lock(operationId, draft.powerMachineId, tx);
      lastReading = (await this.readings.latestAtOrBefore(operationId, draft.powerMachineId, entryReadingTime(draft.workDate, draft.endedAt), tx))?.hours;
    }
    const { columns, issues } = completeDraft(draft, field, lastReading);
    if (issues.length > 0) throw validation(issues);
    return columns;
  }

  /** The meter end becomes a reading of the power unit, checked against its neighbours in time. */
  private async recordMeterOrThrow(actor: Actor, entry: WorkEntry, tx: Executor): Promise<void> {
    if (entry.meterEnd === null || entry.powerMachineId === null) return;
    try {
      await this.meter.recordOrThrow(tx, actor.operationId, entry.powerMachineId, {
        readAt: entryReadingTime(entry.workDate, entry.endedAt),
        hours: new Decimal(entry.meterEnd),
        kind: 'reading',
        source: 'work-entry',
        workEntryId: entry.id,
        createdBy: actor.userId,
      });
    } catch (err) {
      // The reading's rule speaks of its hours; in an entry those hours are the meter end.
      if (err instanceof AppError && err.code === 'validation') throw validation(err.issues.map((i) => ({ path: 'meterEnd', message: i.message })));
      throw err;
    }
  }

  private async present(actor: Actor, id: string): Promise<WorkEntryWithWarnings> {
    const view = await this.repo.findView(actor.operationId, id);
    if (!view) throw notFound('No such work entry.');
    requireEntryAccess(actor, 'read', view);
    return { ...toWorkEntryDto(view), warnings: await this.warningsFor(actor.operationId, view) };
  }

  private async warningsFor(operationId: string, entry: WorkEntry): Promise<WorkEntryWarning[]> {
    const machineIds = [entry.powerMachineId, entry.implementMachineId].filter((m): m is string => m !== null);
    const [machineRows, sameDay] = await Promise.all([
      this.refs.machinesByIds(operationId, machineIds),
      this.repo.sameDay(operationId, entry.workDate, machineIds, entry.id),
    ]);
    const byId = new Map(machineRows.map((m) => [m.id, m]));
    return plausibilityWarnings({
      entry: checkedOf(entry),
      power: (entry.powerMachineId && byId.get(entry.powerMachineId)) || null,
      implement: (entry.implementMachineId && byId.get(entry.implementMachineId)) || null,
      sameDay: sameDay.map((s) => ({ ...checkedOf(s), id: s.id, label: `${s.fieldName}, ${s.hours} h` })),
    });
  }
}

function checkedOf(e: Omit<CheckedEntry, 'id'> & { id: string }): CheckedEntry {
  return {
    id: e.id,
    hours: e.hours,
    operatorHours: e.operatorHours,
    acres: e.acres,
    startedAt: e.startedAt,
    endedAt: e.endedAt,
    meterStart: e.meterStart,
    meterEnd: e.meterEnd,
    powerMachineId: e.powerMachineId,
    implementMachineId: e.implementMachineId,
  };
}

function versionOrThrow(entry: WorkEntry, version: number): void {
  if (entry.version !== version) {
    throw conflict(`This entry changed since you opened it (your version ${version}, now ${entry.version}). Reload it and make your change again.`);
  }
}

