import { afterEach, describe, expect, it } from 'vitest';
import { workEntryCreateSchema, workEntryUpdateSchema } from '@hitchbook/shared/schemas/work-entries';
import { blankEntry, entryChangePayload, entryIssuePath, hoursReadout, newEntryPayload, plainDecimal, type EntryFormValues } from './entryForm';

const ids = {
  operator: '0b6f1c2e-5d1a-4c5e-9a55-2f0d9a3b1c01',
  field: '0b6f1c2e-5d1a-4c5e-9a55-2f0d9a3b1c02',
  workType: '0b6f1c2e-5d1a-4c5e-9a55-2f0d9a3b1c03',
  tractor: '0b6f1c2e-5d1a-4c5e-9a55-2f0d9a3b1c04',
  cutter: '0b6f1c2e-5d1a-4c5e-9a55-2f0d9a3b1c05',
  billTo: '0b6f1c2e-5d1a-4c5e-9a55-2f0d9a3b1c06',
  client: '0b6f1c2e-5d1a-4c5e-9a55-2f0d9a3b1c07',
};

function roadsidePass(): EntryFormValues {
  return {
    ...blankEntry('2025-06-03', ids.operator, { powerMachineId: ids.tractor, implementMachineId: ids.cutter }),
    fieldId: ids.field,
    workTypeId: ids.workType,
    billToPartyId: ids.billTo,
    meterStart: '6251.3',
    meterEnd: '6254.8',
    miles: '1.75',
  };
}

const originalTz = process.env.TZ;
afterEach(() => {
  process.env.TZ = originalTz;
});

describe('hours shown as the entry is filled', () => {
  it('takes meter end minus start, exactly', () => {
    expect(hoursReadout({ ...roadsidePass(), meterStart: '6251.3', meterEnd: '6254.8' })).toEqual({ hours: '3.5', problem: null, long: false });
  });

  it('names both readings when the end is below the start', () => {
    expect(hoursReadout({ ...roadsidePass(), meterEnd: '6250.0' }).problem).toBe('The meter end 6250.0 is below the start 6251.3.');
  });

  it('works the clock times out to the hundredth', () => {
    expect(hoursReadout({ ...roadsidePass(), timing: 'clock', startTime: '07:30', endTime: '11:10' }).hours).toBe('3.67');
  });

  it('flags more than sixteen hours as long', () => {
    expect(hoursReadout({ ...roadsidePass(), timing: 'hours', hours: '17' }).long).toBe(true);
    expect(hoursReadout({ ...roadsidePass(), timing: 'hours', hours: '16' }).long).toBe(false);
  });

  it('waits quietly while a figure is missing', () => {
    expect(hoursReadout({ ...roadsidePass(), meterEnd: '' })).toEqual({ hours: null, problem: null, long: false });
  });
});

describe('new entry payload', () => {
  it('carries the device-made id and passes the shared schema', () => {
    const payload = newEntryPayload(roadsidePass(), ids.client, 'submitted');
    expect(payload.clientId).toBe(ids.client);
    expect(payload.state).toBe('submitted');
    expect(workEntryCreateSchema.safeParse(payload).success).toBe(true);
  });

  it('sends only the timing that was chosen, so the server derives hours from it', () => {
    const clock = newEntryPayload({ ...roadsidePass(), timing: 'clock', startTime: '07:30', endTime: '11:00' }, ids.client, 'draft');
    expect(clock.meterStart).toBeNull();
    expect(clock.meterEnd).toBeNull();
    expect(clock.hours).toBeNull();
    expect(clock.startedAt).toMatch(/^2025-06-03T07:30:00[+-]\d{2}:\d{2}$/);
    expect(workEntryCreateSchema.safeParse(clock).success).toBe(true);
  });

  it('writes the clock times with the phone’s offset on the day of the work', () => {
    process.env.TZ = 'America/Chicago';
    const clock = newEntryPayload({ ...roadsidePass(), timing: 'clock', startTime: '07:30', endTime: '11:00' }, ids.client, 'draft');
    expect(clock.startedAt).toBe('2025-06-03T07:30:00-05:00');
    expect(clock.endedAt).toBe('2025-06-03T11:00:00-05:00');
  });

  it('is refused without any hours, naming the hours field', () => {
    const result = workEntryCreateSchema.safeParse(newEntryPayload({ ...roadsidePass(), timing: 'hours', hours: '' }, ids.client, 'draft'));
    expect(result.error?.issues.map((i) => i.path.join('.'))).toContain('hours');
  });

  it('leaves the operator to the server when none is picked', () => {
    expect(newEntryPayload({ ...roadsidePass(), operatorUserId: '' }, ids.client, 'draft').operatorUserId).toBeUndefined();
  });
});

describe('changing a stored entry', () => {
  it('sends what was changed and the version it was changed against', () => {
    const change = entryChangePayload({ ...roadsidePass(), meterEnd: '6255.8' }, roadsidePass(), 3);
    expect(change).toEqual({ meterEnd: '6255.8', version: 3 });
    expect(workEntryUpdateSchema.safeParse(change).success).toBe(true);
  });

  it('leaves an untouched empty figure out, so the stored one is not filled in again', () => {
    const stored = { ...roadsidePass(), acres: '' };
    expect(entryChangePayload({ ...stored, notes: 'Wet at the culvert' }, stored, 2)).toEqual({ notes: 'Wet at the culvert', version: 2 });
  });

  it('sends the clock times together with the clearing of the meter when the timing changes', () => {
    const change = entryChangePayload({ ...roadsidePass(), timing: 'clock', startTime: '07:30', endTime: '10:00' }, roadsidePass(), 4);
    expect(change.meterStart).toBeNull();
    expect(change.meterEnd).toBeNull();
    expect(change.startedAt).toMatch(/^2025-06-03T07:30:00/);
  });
});

describe('server issues', () => {
  it('land on the clock inputs for the instants', () => {
    expect(entryIssuePath('startedAt')).toBe('startTime');
    expect(entryIssuePath('endedAt')).toBe('endTime');
    expect(entryIssuePath('meterEnd')).toBe('meterEnd');
  });
});

describe('prefilled quantities', () => {
  it('drop the trailing zeros of the stored scale', () => {
    expect(plainDecimal('61.200')).toBe('61.2');
    expect(plainDecimal('40.000')).toBe('40');
    expect(plainDecimal('1.552')).toBe('1.552');
  });
});
