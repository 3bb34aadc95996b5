import type { NewWorkEntry } from '../work/api/saveWorkEntry';

/** A complete new entry for the queue's tests; ids are random, so entries never collide. */
export function payload(overrides: Partial<NewWorkEntry> = {}): NewWorkEntry {
  return {
    clientId: crypto.randomUUID(),
    workDate: '2026-05-14',
    fieldId: crypto.randomUUID(),
    workTypeId: crypto.randomUUID(),
    powerMachineId: crypto.randomUUID(),
    implementMachineId: null,
    meterStart: '1200.5',
    meterEnd: '1203',
    startedAt: null,
    endedAt: null,
    hours: null,
    acres: null,
    miles: null,
    loads: null,
    fuelGallons: null,
    billToPartyId: crypto.randomUUID(),
    notes: null,
    state: 'submitted',
    ...overrides,
  };
}
