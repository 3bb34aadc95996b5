import { Decimal } from 'decimal.js';
import type { NewWorkEntry, WorkEntry } from '@hitchbook/db';
import { MAX_ENTRY_HOURS, type WorkEntryCreateInput, type WorkEntryUpdateInput } from '@hitchbook/shared/schemas/work-entries';
import type { FieldIssue } from '../../common/errors/app-error.js';
import type { FieldRef } from './references.repository.js';

/** What a field lends an entry by default: its acres, and a road stretch's length. */
export type FieldDefaults = Pick<FieldRef, 'kind' | 'acres' | 'lengthMiles'>;

/**
 * The entry as the caller means it, before the server fills in its defaults. A null quantity means
 * "not given": hours then come from the meter or the clock, operator hours from the machine hours,
 * acres from the field and miles from a road stretch.
 */
export interface EntryDraft {
  workDate: string;
  operatorUserId: string;
  fieldId: string;
  workTypeId: string;
  powerMachineId: string | null;
  implementMachineId: string | null;
  meterStart: Decimal | null;
  meterEnd: Decimal | null;
  startedAt: Date | null;
  endedAt: Date | null;
  hours: Decimal | null;
  operatorHours: Decimal | null;
  acres: Decimal | null;
  miles: Decimal | null;
  loads: Decimal | null;
  eachCount: Decimal | null;
  fuelGallons: Decimal | null;
  billToPartyId: string;
  notes: string | null;
}

export type EntryColumns = Required<
  Pick<
    NewWorkEntry,
    | 'workDate'
    | 'operatorUserId'
    | 'fieldId'
    | 'workTypeId'
    | 'powerMachineId'
    | 'implementMachineId'
    | 'meterStart'
    | 'meterEnd'
    | 'startedAt'
    | 'endedAt'
    | 'hours'
    | 'operatorHours'
    | 'acres'
    | 'miles'
    | 'loads'
    | 'eachCount'
    | 'fuelGallons'
    | 'billToPartyId'
    | 'notes'
  >
>;

const dec = (v: string | null): Decimal | null => (v === null ? null : new Decimal(v));
const date = (v: string | null | undefined): Date | null => (v ? new Date(v) : null);
/** In the column's own scale, so a preview shows 12.000 acres as the table will. */
const scaled = (v: Decimal | null, decimals: number): string | null => (v === null ? null : v.toFixed(decimals));

export function draftFromCreate(input: WorkEntryCreateInput, operatorUserId: string): EntryDraft {
  return {
    workDate: input.workDate,
    operatorUserId,
    fieldId: input.fieldId,
    workTypeId: input.workTypeId,
    powerMachineId: input.powerMachineId ?? null,
    implementMachineId: input.implementMachineId ?? null,
    meterStart: input.meterStart ?? null,
    meterEnd: input.meterEnd ?? null,
    startedAt: date(input.startedAt),
    endedAt: date(input.endedAt),
    hours: input.hours ?? null,
    operatorHours: input.operatorHours ?? null,
    acres: input.acres ?? null,
    miles: input.miles ?? null,
    loads: input.loads ?? null,
    eachCount: input.eachCount ?? null,
    fuelGallons: input.fuelGallons ?? null,
    billToPartyId: input.billToPartyId,
    notes: input.notes ?? null,
  };
}

/**
 * The stored entry with the patch laid over it. Values the server derived before follow their inputs
 * when those change (new meter or clock → new hours; new field → its acres), unless the patch gives
 * them; values the caller typed stay as typed.
 */
export function draftFromUpdate(existing: WorkEntry, patch: WorkEntryUpdateInput, oldField: FieldDefaults | undefined): EntryDraft {
  const pick = <K extends keyof WorkEntryUpdateInput>(key: K) => patch[key] !== undefined;
  const timingChanged = pick('meterStart') || pick('meterEnd') || pick('startedAt') || pick('endedAt');
  const hours = pick('hours') ? (patch.hours ?? null) : timingChanged ? null : dec(existing.hours);
  const operatorHoursFollowed = existing.operatorHours === null || new Decimal(existing.operatorHours).eq(existing.hours);
  const fieldChanged = pick('fieldId') && patch.fieldId !== existing.fieldId;
  const acresFromField = oldField !== undefined && existing.acres !== null && new Decimal(existing.acres).eq(oldField.acres);
  const milesFromField = oldField?.lengthMiles != null && existing.miles !== null && new Decimal(existing.miles).eq(oldField.lengthMiles);

  return {
    workDate: patch.workDate ?? existing.workDate,
    operatorUserId: patch.operatorUserId ?? existing.operatorUserId,
    fieldId: patch.fieldId ?? existing.fieldId,
    workTypeId: patch.workTypeId ?? existing.workTypeId,
    powerMachineId: pick('powerMachineId') ? (patch.powerMachineId ?? null) : existing.powerMachineId,
    implementMachineId: pick('implementMachineId') ? (patch.implementMachineId ?? null) : existing.implementMachineId,
    meterStart: pick('meterStart') ? (patch.meterStart ?? null) : dec(existing.meterStart),
    meterEnd: pick('meterEnd') ? (patch.meterEnd ?? null) : dec(existing.meterEnd),
    startedAt: pick('startedAt') ? date(patch.startedAt) : existing.startedAt,
    endedAt: pick('endedAt') ? date(patch.endedAt) : existing.endedAt,
    hours,
    operatorHours: pick('operatorHours') ? (patch.operatorHours ?? null) : operatorHoursFollowed ? null : dec(existing.operatorHours),
    acres: pick('acres') ? (patch.acres ?? null) : fieldChanged && acresFromField ? null : dec(existing.acres),
    miles: pick('miles') ? (patch.miles ?? null) : fieldChanged && milesFromField ? null : dec(existing.miles),
    loads: pick('loads') ? (patch.loads ?? null) : dec(existing.loads),
    eachCount: pick('eachCount') ? (patch.eachCount ?? null) : dec(existing.eachCount),
    fuelGallons: pick('fuelGallons') ? (patch.fuelGallons ?? null) : dec(existing.fuelGallons),
    billToPartyId: patch.billToPartyId ?? existing.billToPartyId,
    notes: pick('notes') ? (patch.notes ?? null) : existing.notes,
  };
}

/** Clock time in hours to the hundredth, as the hours column keeps it. */
export function clockHours(startedAt: Date, endedAt: Date): Decimal {
  return new Decimal(endedAt.getTime() - startedAt.getTime()).div(3_600_000).toDecimalPlaces(2, Decimal.ROUND_HALF_UP);
}

/**
 * Fills in the defaults and checks what only the whole entry can show. `lastReading` is the power
 * unit's reading before this entry, the default meter start.
 */
export function completeDraft(draft: EntryDraft, field: FieldDefaults, lastReading: string | undefined): { columns: EntryColumns; issues: FieldIssue[] } {
  const issues: FieldIssue[] = [];
  let meterStart = draft.meterStart;
  if (draft.meterEnd && !meterStart) {
    if (lastReading !== undefined) meterStart = new Decimal(lastReading);
    else issues.push({ path: 'meterStart', message: 'This machine has no earlier reading; enter the meter start.' });
  }
  if ((meterStart || draft.meterEnd) && !draft.powerMachineId) {
    issues.push({ path: 'powerMachineId', message: 'Meter readings belong to a power unit; pick the one you read.' });
  }
  if (meterStart && !draft.meterEnd) issues.push({ path: 'meterEnd', message: 'Give the meter end too, or leave the meter out.' });

  let meterHours: Decimal | null = null;
  if (meterStart && draft.meterEnd) {
    meterHours = draft.meterEnd.minus(meterStart);
    if (meterHours.lt(0)) issues.push({ path: 'meterEnd', message: `Meter end ${draft.meterEnd.toFixed(1)} is below meter start ${meterStart.toFixed(1)}.` });
    else if (meterHours.gt(MAX_ENTRY_HOURS)) {
      issues.push({ path: 'meterEnd', message: `Meter end ${draft.meterEnd.toFixed(1)} is ${meterHours.toFixed(1)} h after meter start ${meterStart.toFixed(1)}; one entry holds at most ${MAX_ENTRY_HOURS} h.` });
    }
  }
  let clock: Decimal | null = null;
  if (draft.startedAt && draft.endedAt) {
    clock = clockHours(draft.startedAt, draft.endedAt);
    if (clock.lt(0)) issues.push({ path: 'endedAt', message: 'The end time is before the start time.' });
    else if (clock.gt(MAX_ENTRY_HOURS)) issues.push({ path: 'endedAt', message: `More than ${MAX_ENTRY_HOURS} hours between start and end.` });
  }

  const hours = draft.hours ?? meterHours ?? clock;
  // With a meter or clock problem already named, "no hours" would only repeat it.
  if (hours === null && issues.length === 0) issues.push({ path: 'hours', message: 'Give the hours, the meter end (and start), or the start and end times.' });
  const safeHours = hours !== null && hours.gte(0) && hours.lte(MAX_ENTRY_HOURS) ? hours : new Decimal(0);

  const columns: EntryColumns = {
    workDate: draft.workDate,
    operatorUserId: draft.operatorUserId,
    fieldId: draft.fieldId,
    workTypeId: draft.workTypeId,
    powerMachineId: draft.powerMachineId,
    implementMachineId: draft.implementMachineId,
    meterStart: scaled(meterStart, 1),
    meterEnd: scaled(draft.meterEnd, 1),
    startedAt: draft.startedAt,
    endedAt: draft.endedAt,
    hours: safeHours.toFixed(2),
    operatorHours: (draft.operatorHours ?? safeHours).toFixed(2),
    acres: scaled(draft.acres, 3) ?? field.acres,
    miles: scaled(draft.miles, 3) ?? (field.kind === 'roadside' ? field.lengthMiles : null),
    loads: scaled(draft.loads, 2),
    eachCount: scaled(draft.eachCount, 2),
    fuelGallons: scaled(draft.fuelGallons, 3),
    billToPartyId: draft.billToPartyId,
    notes: draft.notes,
  };
  return { columns, issues };
}
