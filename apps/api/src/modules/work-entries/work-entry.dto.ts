import type { WorkEntryDto } from '@hitchbook/shared/schemas/work-entries';
import type { WorkEntryView } from './work-entries.repository.js';

/** What callers see of an entry: quantities and names, no money (operators may read every field). */
export function toWorkEntryDto(v: WorkEntryView): WorkEntryDto {
  return {
    id: v.id,
    clientId: v.clientId,
    workDate: v.workDate,
    operatorUserId: v.operatorUserId,
    operatorName: v.operatorName,
    fieldId: v.fieldId,
    fieldName: v.fieldName,
    workTypeId: v.workTypeId,
    workTypeName: v.workTypeName,
    powerMachineId: v.powerMachineId,
    powerMachineName: v.powerMachineName,
    implementMachineId: v.implementMachineId,
    implementMachineName: v.implementMachineName,
    meterStart: v.meterStart,
    meterEnd: v.meterEnd,
    startedAt: v.startedAt?.toISOString() ?? null,
    endedAt: v.endedAt?.toISOString() ?? null,
    hours: v.hours,
    operatorHours: v.operatorHours,
    acres: v.acres,
    miles: v.miles,
    loads: v.loads,
    eachCount: v.eachCount,
    fuelGallons: v.fuelGallons,
    billToPartyId: v.billToPartyId,
    billToName: v.billToName,
    notes: v.notes,
    state: v.state,
    submittedAt: v.submittedAt?.toISOString() ?? null,
    approvedAt: v.approvedAt?.toISOString() ?? null,
    version: v.version,
    createdAt: v.createdAt.toISOString(),
    updatedAt: v.updatedAt.toISOString(),
  };
}
