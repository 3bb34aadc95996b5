import { describe, expect, it } from 'vitest';
import { isCalendarDate, workEntryCreateSchema, workEntryListQuerySchema, workEntryUpdateSchema } from './work-entries.js';

const ids = {
  field: '6f1c1c52-4b8e-4a57-9d55-2b7b7b0e9a01',
  workType: '6f1c1c52-4b8e-4a57-9d55-2b7b7b0e9a02',
  party: '6f1c1c52-4b8e-4a57-9d55-2b7b7b0e9a03',
  tractor: '6f1c1c52-4b8e-4a57-9d55-2b7b7b0e9a04',
};
const base = { workDate: '2025-06-03', fieldId: ids.field, workTypeId: ids.workType, billToPartyId: ids.party };

function pathsOf(result: { success: boolean; error?: { issues: { path: PropertyKey[] }[] } }): string[] {
  return (result.error?.issues ?? []).map((i) => i.path.join('.')).sort();
}

describe('workEntryCreateSchema', () => {
  it('accepts decimals as JSON numbers or strings and keeps them exact', () => {
    const parsed = workEntryCreateSchema.parse({ ...base, hours: '2.25', acres: 18.125 });
    expect(parsed.hours?.toFixed()).toBe('2.25');
    expect(parsed.acres?.toFixed()).toBe('18.125');
    expect(parsed.state).toBe('draft');
  });

  it('asks for hours when neither hours, a meter end nor both clock times are given', () => {
    expect(pathsOf(workEntryCreateSchema.safeParse({ ...base, startedAt: '2025-06-03T07:00:00-05:00' }))).toEqual(['hours']);
  });

  it('refuses a meter end below the start, and a meter without a power unit', () => {
    const res = workEntryCreateSchema.safeParse({ ...base, meterStart: '1200.5', meterEnd: '1199.0' });
    expect(pathsOf(res)).toEqual(['meterEnd', 'powerMachineId']);
    expect(res.error?.issues.find((i) => i.path[0] === 'meterEnd')?.message).toContain('1199');
  });

  it('refuses more than 24 hours on the clock or the meter', () => {
    expect(pathsOf(workEntryCreateSchema.safeParse({ ...base, startedAt: '2025-06-03T06:00:00Z', endedAt: '2025-06-04T07:00:00Z' }))).toEqual(['endedAt']);
    expect(pathsOf(workEntryCreateSchema.safeParse({ ...base, powerMachineId: ids.tractor, meterStart: '100', meterEnd: '124.1' }))).toEqual(['meterEnd']);
  });

  it('refuses more decimals than the column keeps, unknown fields and a made-up state', () => {
    const res = workEntryCreateSchema.safeParse({ ...base, hours: '1.234', price: '12', state: 'approved' });
    expect(pathsOf(res)).toEqual(['', 'hours', 'state']);
  });
});

describe('workEntryUpdateSchema', () => {
  it('needs the version and lets a nullable field be cleared', () => {
    expect(pathsOf(workEntryUpdateSchema.safeParse({ notes: 'x' }))).toEqual(['version']);
    const parsed = workEntryUpdateSchema.parse({ version: 3, implementMachineId: null });
    expect(parsed).toEqual({ version: 3, implementMachineId: null });
  });
});

describe('workEntryListQuerySchema', () => {
  it('reads a comma-separated state list and refuses an unknown state or dates out of order', () => {
    expect(workEntryListQuerySchema.parse({ state: 'submitted,approved' }).state).toEqual(['submitted', 'approved']);
    expect(pathsOf(workEntryListQuerySchema.safeParse({ state: 'submitted,lost' }))).toEqual(['state.1']);
    expect(pathsOf(workEntryListQuerySchema.safeParse({ dateFrom: '2025-06-02', dateTo: '2025-06-01' }))).toEqual(['dateTo']);
  });

  it('refuses a repeated query parameter instead of picking one', () => {
    expect(pathsOf(workEntryListQuerySchema.safeParse({ fieldId: [ids.field, ids.party] }))).toEqual(['fieldId']);
  });
});

describe('isCalendarDate', () => {
  it('knows leap days and refuses impossible dates', () => {
    expect(isCalendarDate('2024-02-29')).toBe(true);
    expect(isCalendarDate('2025-02-29')).toBe(false);
    expect(isCalendarDate('2025-13-01')).toBe(false);
    expect(isCalendarDate('25-06-03')).toBe(false);
  });
});
