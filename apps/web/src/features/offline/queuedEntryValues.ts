import { localParts } from '../../lib/localTime';
import type { NewWorkEntry } from '../work/api/saveWorkEntry';
import type { EntryFormValues } from '../work/entryForm';

const text = (value: string | number | null | undefined) => (value == null ? '' : String(value));

/** A queued entry back into the cab form's fields, so a refused one can be fixed as it was typed. */
export function queuedEntryValues(payload: NewWorkEntry): EntryFormValues {
  const timing = payload.meterEnd ? 'meter' : payload.startedAt && payload.endedAt ? 'clock' : 'hours';
  return {
    workDate: payload.workDate,
    operatorUserId: text(payload.operatorUserId),
    fieldId: payload.fieldId,
    workTypeId: payload.workTypeId,
    powerMachineId: text(payload.powerMachineId),
    implementMachineId: text(payload.implementMachineId),
    timing,
    meterStart: text(payload.meterStart),
    meterEnd: text(payload.meterEnd),
    startTime: payload.startedAt ? localParts(payload.startedAt).time : '',
    endTime: payload.endedAt ? localParts(payload.endedAt).time : '',
    hours: timing === 'hours' ? text(payload.hours) : '',
    acres: text(payload.acres),
    miles: text(payload.miles),
    loads: text(payload.loads),
    fuelGallons: text(payload.fuelGallons),
    billToPartyId: payload.billToPartyId,
    notes: text(payload.notes),
  };
}
