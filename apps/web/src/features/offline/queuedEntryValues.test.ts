import { describe, expect, it } from 'vitest';
import { localInstantIso } from '../../lib/localTime';
import { newEntryPayload } from '../work/entryForm';
import { queuedEntryValues } from './queuedEntryValues';
import { payload } from './testPayload';

describe('a queued entry back in the form', () => {
  it('gives back the same entry for meter, clock and typed hours', () => {
    const byMeter = payload();
    const startedAt = localInstantIso('2026-05-14', '07:30');
    const endedAt = localInstantIso('2026-05-14', '11:45');
    const byClock = payload({ meterStart: null, meterEnd: null, startedAt, endedAt, acres: '42.5', notes: 'North half' });
    const byHours = payload({ meterStart: null, meterEnd: null, hours: '3.25', powerMachineId: null, state: 'draft', operatorUserId: crypto.randomUUID() });
    for (const queued of [byMeter, byClock, byHours]) {
      const state = queued.state === 'draft' ? 'draft' : 'submitted';
      expect(newEntryPayload(queuedEntryValues(queued), queued.clientId, state)).toEqual({ ...queued, operatorUserId: queued.operatorUserId ?? undefined });
    }
  });

  it('picks the timing the entry was logged with', () => {
    expect(queuedEntryValues(payload()).timing).toBe('meter');
    expect(queuedEntryValues(payload({ meterStart: null, meterEnd: null, hours: '2' })).timing).toBe('hours');
  });
});
