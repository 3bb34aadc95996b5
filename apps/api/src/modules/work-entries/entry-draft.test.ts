import { Decimal } from 'decimal.js';
import type { WorkEntry } from '@hitchbook/db';
import { describe, expect, it } from 'vitest';
import { clockHours, completeDraft, draftFromUpdate } from './entry-draft.js';

const home40 = { kind: 'field' as const, acres: '40.000', lengthMiles: null };
const creek80 = { kind: 'field' as const, acres: '78.500', lengthMiles: null };

function stored(overrides: Partial<WorkEntry> = {}): WorkEntry {
  return {
    id: 'e1', operationId: 'op', workDate: '2025-06-03', operatorUserId: 'u1', fieldId: 'home40', powerMachineId: 't1', implementMachineId: null, workTypeId: 'w1',
    meterStart: '100.0', meterEnd: '103.0', startedAt: null, endedAt: null, hours: '3.00', operatorHours: '3.00', acres: '40.000', miles: null, loads: null, eachCount: null,
    fuelGallons: null, billToPartyId: 'p1', notes: null, state: 'draft', submittedAt: null, approvedAt: null, approvedBy: null, clientId: null, importKey: null, version: 1,
    createdBy: 'u1', createdAt: new Date(), updatedAt: new Date(), ...overrides,
  };
}

describe('clockHours', () => {
  it('rounds clock time to the hundredth of an hour', () => {
    expect(clockHours(new Date('2025-06-03T07:00:00Z'), new Date('2025-06-03T09:20:00Z')).toFixed(2)).toBe('2.33');
  });
});

describe('draftFromUpdate', () => {
  it('lets derived hours, operator hours and acres follow their inputs', () => {
    const draft = draftFromUpdate(stored(), { version: 1, meterEnd: new Decimal('104.5'), fieldId: 'creek80' }, home40);
    const { columns } = completeDraft(draft, creek80, undefined);
    expect(columns).toMatchObject({ hours: '4.50', operatorHours: '4.50', acres: '78.500' });
  });

  it('keeps what the caller typed: entered hours, own operator hours and partial acres', () => {
    const draft = draftFromUpdate(stored({ hours: '2.00', operatorHours: '2.50', acres: '12.000' }), { version: 1, fieldId: 'creek80', notes: 'moved' }, home40);
    const { columns } = completeDraft(draft, creek80, undefined);
    expect(columns).toMatchObject({ hours: '2.00', operatorHours: '2.50', acres: '12.000', notes: 'moved' });
  });

  it('clears a value set to null and derives it again', () => {
    const draft = draftFromUpdate(stored({ acres: '12.000' }), { version: 1, acres: null }, home40);
    expect(completeDraft(draft, home40, undefined).columns.acres).toBe('40.000');
  });
});

describe('completeDraft', () => {
  it('takes the meter start from the last reading and names a missing power unit', () => {
    const base = draftFromUpdate(stored({ meterStart: null, meterEnd: null }), { version: 1 }, home40);
    expect(completeDraft({ ...base, meterEnd: new Decimal('1253.5'), hours: null }, home40, '1250.0').columns).toMatchObject({ meterStart: '1250.0', hours: '3.50' });
    const { issues } = completeDraft({ ...base, powerMachineId: null, meterStart: new Decimal('1'), meterEnd: new Decimal('2'), hours: null }, home40, undefined);
    expect(issues.map((i) => i.path)).toEqual(['powerMachineId']);
  });

  it('refuses more than 24 hours from the meter', () => {
    const base = draftFromUpdate(stored(), { version: 1 }, home40);
    const { issues } = completeDraft({ ...base, meterStart: new Decimal('100'), meterEnd: new Decimal('124.5'), hours: null }, home40, undefined);
    expect(issues).toEqual([{ path: 'meterEnd', message: expect.stringContaining('24.5 h after meter start') }]);
  });

  it('gives a road stretch its length in miles', () => {
    const road = { kind: 'roadside' as const, acres: '2.000', lengthMiles: '2.000' };
    const draft = draftFromUpdate(stored({ miles: null }), { version: 1 }, road);
    expect(completeDraft(draft, road, undefined).columns.miles).toBe('2.000');
  });
});
