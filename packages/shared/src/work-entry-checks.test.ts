import { describe, expect, it } from 'vitest';
import {
  capacityMachineOf,
  fieldCapacityWarning,
  longEntryWarning,
  plausibilityWarnings,
  sameDayWarnings,
  workingCapacity,
  type CheckedMachine,
  type NeighbourEntry,
} from './work-entry-checks.js';

function machine(overrides: Partial<CheckedMachine>): CheckedMachine {
  return { id: 'm1', name: 'Cutter', classId: 'rotary-mower', kind: 'implement', widthFt: '15', speedMph: null, fieldEfficiencyPct: null, ...overrides };
}

const at = (hhmm: string) => new Date(`2025-06-03T${hhmm}:00-05:00`);

describe('workingCapacity', () => {
  it('uses the class typical speed and efficiency: a 15-ft rotary mower at 7 mph and 80 % covers 10.18 ac/h (acres/h = mph × ft × efficiency / 8.25, Iowa State AgDM A3-24; speed and efficiency are ASABE D497 typical values, from memory)', () => {
    const capacity = workingCapacity(machine({}));
    expect(capacity?.acresPerHour.toFixed(2)).toBe('10.18');
  });

  it("prefers the machine's own figures: a 40-ft spreader at 6 mph and 70 % covers 20.4 ac/h (Iowa State AgDM A3-24, Table 1)", () => {
    const spreader = machine({ classId: 'fertilizer-spreader', widthFt: '40', speedMph: '6', fieldEfficiencyPct: '70' });
    expect(workingCapacity(spreader)?.acresPerHour.toFixed(1)).toBe('20.4');
  });

  it('has no capacity without a width, for a class without field speed, or for an unknown class', () => {
    expect(workingCapacity(machine({ widthFt: null }))).toBeNull();
    expect(workingCapacity(machine({ classId: 'grain-cart' }))).toBeNull();
    expect(workingCapacity(machine({ classId: 'hovercraft' }))).toBeNull();
  });

  it('checks a grain cart when the machine gives its own speed and efficiency', () => {
    expect(workingCapacity(machine({ classId: 'grain-cart', widthFt: '10', speedMph: '5', fieldEfficiencyPct: '50' }))?.acresPerHour.toFixed(2)).toBe('3.03');
  });
});

describe('capacityMachineOf', () => {
  it('takes the implement, else a self-propelled machine, never a bare tractor', () => {
    const tractor = machine({ id: 't', kind: 'power', classId: 'tractor-mfwd' });
    const windrower = machine({ id: 'w', kind: 'self-propelled', classId: 'windrower-sp' });
    const cutter = machine({});
    expect(capacityMachineOf(tractor, cutter)).toBe(cutter);
    expect(capacityMachineOf(windrower, null)).toBe(windrower);
    expect(capacityMachineOf(tractor, null)).toBeNull();
  });
});

describe('fieldCapacityWarning', () => {
  const spreader = machine({ name: 'Spinner', classId: 'fertilizer-spreader', widthFt: '40', speedMph: '6', fieldEfficiencyPct: '70' });

  it('warns above the A3-24 capacity of 20.36 ac/h and stays quiet at or below it (Iowa State AgDM A3-24, Table 1)', () => {
    const warning = fieldCapacityWarning({ hours: '2', acres: '42' }, spreader);
    expect(warning?.code).toBe('above-field-capacity');
    expect(warning?.message).toContain('21.0 ac/h');
    expect(warning?.message).toContain('20.4 ac/h');
    expect(fieldCapacityWarning({ hours: '2', acres: '40.7' }, spreader)).toBeNull();
  });

  it('says nothing without hours or acres', () => {
    expect(fieldCapacityWarning({ hours: '0', acres: '40' }, spreader)).toBeNull();
    expect(fieldCapacityWarning({ hours: '2', acres: null }, spreader)).toBeNull();
  });
});

describe('longEntryWarning', () => {
  it('warns above 16 machine or operator hours, not at 16 (common practice, no source)', () => {
    expect(longEntryWarning({ hours: '16' })).toBeNull();
    expect(longEntryWarning({ hours: '16.25' })?.code).toBe('long-entry');
    expect(longEntryWarning({ hours: '10', operatorHours: '17' })?.message).toContain('17.00 h');
  });
});

describe('sameDayWarnings', () => {
  const base = { hours: '2', powerMachineId: 'tractor', implementMachineId: 'disk' };
  const neighbour = (overrides: Partial<NeighbourEntry>): NeighbourEntry => ({ id: 'other', label: 'Creek 80', hours: '2', powerMachineId: 'tractor', implementMachineId: null, ...overrides });

  it('flags clock times that overlap an entry on the same tractor or implement', () => {
    const entry = { ...base, startedAt: at('09:00'), endedAt: at('11:00') };
    const clash = neighbour({ startedAt: at('10:30'), endedAt: at('12:00') });
    expect(sameDayWarnings(entry, [clash]).map((w) => w.code)).toEqual(['clock-overlap']);
    expect(sameDayWarnings(entry, [neighbour({ powerMachineId: 'other-tractor', implementMachineId: 'disk', startedAt: at('10:30'), endedAt: at('12:00') })]).map((w) => w.code)).toEqual(['clock-overlap']);
  });

  it('does not flag entries that touch end to start, a lunch break, another machine or the entry itself', () => {
    const entry = { ...base, id: 'me', startedAt: at('09:00'), endedAt: at('11:00') };
    const others = [
      neighbour({ startedAt: at('11:00'), endedAt: at('12:00') }),
      neighbour({ id: 'lunch', startedAt: at('13:00'), endedAt: at('15:00') }),
      neighbour({ id: 'elsewhere', powerMachineId: 'other-tractor', startedAt: at('09:30'), endedAt: at('10:00') }),
      neighbour({ id: 'me', startedAt: at('09:00'), endedAt: at('11:00') }),
    ];
    expect(sameDayWarnings(entry, others)).toEqual([]);
  });

  it('flags a meter range that overlaps another entry on the same power unit', () => {
    const entry = { ...base, meterStart: '1200.0', meterEnd: '1202.0' };
    const warnings = sameDayWarnings(entry, [neighbour({ meterStart: '1201.5', meterEnd: '1203.0' })]);
    expect(warnings.map((w) => w.code)).toEqual(['meter-overlap']);
    expect(warnings[0]?.message).toContain('Creek 80');
  });

  it('flags meter hours no entry accounts for, before and after, and none when the ranges meet', () => {
    const entry = { ...base, meterStart: '1200.0', meterEnd: '1202.0' };
    const before = neighbour({ id: 'b', label: 'Home 40', meterStart: '1197.0', meterEnd: '1198.5' });
    const after = neighbour({ id: 'a', label: 'Pike 20', meterStart: '1202.4', meterEnd: '1203.0' });
    const warnings = sameDayWarnings(entry, [before, after]);
    expect(warnings.map((w) => w.code)).toEqual(['meter-gap', 'meter-gap']);
    expect(warnings[0]?.message).toContain('1.5 h (1198.5 to 1200.0) after Home 40');
    expect(warnings[1]?.message).toContain('0.4 h (1202.0 to 1202.4) before Pike 20');
    expect(sameDayWarnings(entry, [neighbour({ meterStart: '1198.0', meterEnd: '1200.0' })])).toEqual([]);
  });
});

describe('plausibilityWarnings', () => {
  it('collects every finding and nothing for a plain entry', () => {
    const cutter = machine({ id: 'cutter' });
    const tractor = machine({ id: 'tractor', kind: 'power', classId: 'tractor-2wd', widthFt: null });
    expect(plausibilityWarnings({ entry: { hours: '3', acres: '25', implementMachineId: 'cutter' }, power: tractor, implement: cutter, sameDay: [] })).toEqual([]);
    const codes = plausibilityWarnings({ entry: { hours: '17', acres: '400', implementMachineId: 'cutter' }, power: tractor, implement: cutter, sameDay: [] }).map((w) => w.code);
    expect(codes).toEqual(['above-field-capacity', 'long-entry']);
  });
});
