import type { WorkEntryDto, WorkEntryState } from '@hitchbook/shared/schemas/work-entries';
import { LONG_ENTRY_HOURS } from '@hitchbook/shared/work-entry-limits';
import { localInstantIso, localParts } from '../../lib/localTime';
import type { NewWorkEntry } from './api/saveWorkEntry';
import type { WorkEntryChange } from './api/updateWorkEntry';
import { isQuantity, meterHours, minutesAsHours, plainQuantity, typedHours, type Hours } from './quantity';

/** How the hours are given: read off the hour meter, from the clock, or typed as hours. */
export type TimingMode = 'meter' | 'clock' | 'hours';

/** Every field as typed; numbers stay text until the server reads them. */
export interface EntryFormValues {
  workDate: string;
  operatorUserId: string;
  fieldId: string;
  workTypeId: string;
  powerMachineId: string;
  implementMachineId: string;
  timing: TimingMode;
  meterStart: string;
  meterEnd: string;
  startTime: string;
  endTime: string;
  hours: string;
  acres: string;
  miles: string;
  loads: string;
  fuelGallons: string;
  billToPartyId: string;
  notes: string;
}

export function blankEntry(workDate: string, operatorUserId: string, rig: { powerMachineId: string | null; implementMachineId: string | null }): EntryFormValues {
  return {
    workDate,
    operatorUserId,
    fieldId: '',
    workTypeId: '',
    powerMachineId: rig.powerMachineId ?? '',
    implementMachineId: rig.implementMachineId ?? '',
    timing: 'meter',
    meterStart: '',
    meterEnd: '',
    startTime: '',
    endTime: '',
    hours: '',
    acres: '',
    miles: '',
    loads: '',
    fuelGallons: '',
    billToPartyId: '',
    notes: '',
  };
}

const text = (value: string | null) => value ?? '';

/** A stored quantity ("61.200") as a person would type it ("61.2"), to prefill a field. */
export function plainDecimal(value: string): string {
  return plainQuantity(value);
}

/** A stored entry back into the form, choosing the timing it was logged with. */
export function entryFormValues(entry: WorkEntryDto): EntryFormValues {
  const timing: TimingMode = entry.meterEnd ? 'meter' : entry.startedAt && entry.endedAt ? 'clock' : 'hours';
  return {
    workDate: entry.workDate,
    operatorUserId: entry.operatorUserId,
    fieldId: entry.fieldId,
    workTypeId: entry.workTypeId,
    powerMachineId: text(entry.powerMachineId),
    implementMachineId: text(entry.implementMachineId),
    timing,
    meterStart: text(entry.meterStart),
    meterEnd: text(entry.meterEnd),
    startTime: entry.startedAt ? localParts(entry.startedAt).time : '',
    endTime: entry.endedAt ? localParts(entry.endedAt).time : '',
    hours: timing === 'hours' ? entry.hours : '',
    acres: text(entry.acres),
    miles: text(entry.miles),
    loads: text(entry.loads),
    fuelGallons: text(entry.fuelGallons),
    billToPartyId: entry.billToPartyId,
    notes: text(entry.notes),
  };
}

export interface HoursReadout {
  /** Machine hours as the server will work them out, or null while something is missing. */
  hours: string | null;
  problem: string | null;
  /** More than a long day: allowed (harvest) but worth a second look before sending. */
  long: boolean;
}

const minutesOf = (time: string) => {
  const m = /^(\d{2}):(\d{2})$/.exec(time);
  return m ? Number(m[1]) * 60 + Number(m[2]) : null;
};

function readout(hours: Hours | null, problem: string | null): HoursReadout {
  if (!hours) return { hours: null, problem, long: false };
  return { hours: hours.fixed, problem, long: hours.over(LONG_ENTRY_HOURS) };
}

/** The hours shown live under the timing inputs, computed exactly as the server will. */
export function hoursReadout(values: Pick<EntryFormValues, 'timing' | 'meterStart' | 'meterEnd' | 'startTime' | 'endTime' | 'hours'>): HoursReadout {
  if (values.timing === 'meter') {
    const start = values.meterStart.trim();
    const end = values.meterEnd.trim();
    if (!isQuantity(start) || !isQuantity(end)) return readout(null, null);
    const diff = meterHours(start, end, 1);
    if (diff.negative) return readout(null, `The meter end ${end} is below the start ${start}.`);
    return readout(diff, null);
  }
  if (values.timing === 'clock') {
    const start = minutesOf(values.startTime);
    const end = minutesOf(values.endTime);
    if (start === null || end === null) return readout(null, null);
    if (end < start) return readout(null, 'The end time is before the start time; log work past midnight on the next day.');
    return readout(minutesAsHours(end - start, 2), null);
  }
  const typed = values.hours.trim();
  return isQuantity(typed) ? readout(typedHours(typed, 2), null) : readout(null, null);
}

const orNull = (value: string) => (value.trim() ? value.trim() : null);

/** The entry's body: only the timing that was chosen travels, so the server derives the hours from it. */
function entryBody(values: EntryFormValues) {
  const meter = values.timing === 'meter';
  const clock = values.timing === 'clock';
  return {
    workDate: values.workDate,
    fieldId: values.fieldId,
    workTypeId: values.workTypeId,
    powerMachineId: values.powerMachineId || null,
    implementMachineId: values.implementMachineId || null,
    meterStart: meter ? orNull(values.meterStart) : null,
    meterEnd: meter ? orNull(values.meterEnd) : null,
    startedAt: clock ? localInstantIso(values.workDate, values.startTime) : null,
    endedAt: clock ? localInstantIso(values.workDate, values.endTime) : null,
    hours: values.timing === 'hours' ? orNull(values.hours) : null,
    acres: orNull(values.acres),
    miles: orNull(values.miles),
    loads: orNull(values.loads),
    fuelGallons: orNull(values.fuelGallons),
    billToPartyId: values.billToPartyId,
    notes: orNull(values.notes),
  };
}

export function newEntryPayload(values: EntryFormValues, clientId: string, state: Extract<WorkEntryState, 'draft' | 'submitted'>): NewWorkEntry {
  return { clientId, ...entryBody(values), operatorUserId: values.operatorUserId || undefined, state };
}

/**
 * Only what was changed travels, with the version it was changed against: a field left alone keeps
 * its stored value, even one the server filled in (an empty figure would be filled in again).
 */
export function entryChangePayload(values: EntryFormValues, initial: EntryFormValues, version: number): WorkEntryChange {
  const before = entryBody(initial);
  const after = entryBody(values);
  const changed = Object.fromEntries(Object.entries(after).filter(([key, value]) => before[key as keyof typeof before] !== value));
  return { ...changed, version };
}

/** Where a server issue about the request lands among the fields the operator sees. */
export function entryIssuePath(path: string): string {
  if (path === 'startedAt') return 'startTime';
  if (path === 'endedAt') return 'endTime';
  return path;
}
