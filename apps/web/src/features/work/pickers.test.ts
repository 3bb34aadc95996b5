import { describe, expect, it } from 'vitest';
import type { FieldDto } from '@hitchbook/shared/schemas/fields';
import type { MachineDto } from '@hitchbook/shared/schemas/machines';
import { fieldPickerData, machinePickerData, withBlank } from './pickers';

function machine(id: string, name: string, kind: MachineDto['kind'], unitNumber: string | null = null): MachineDto {
  return { id, name, kind, unitNumber } as MachineDto;
}

function field(id: string, name: string, kind: FieldDto['kind'], farmLabel: string | null, acres: string, lengthMiles: string | null = null): FieldDto {
  return { id, name, kind, farmLabel, acres, lengthMiles } as FieldDto;
}

const fleet = [
  machine('t1', 'Harlan 5105', 'power'),
  machine('t2', 'Tavin’s 65', 'power', '7'),
  machine('c1', 'Brakkefield C-890', 'self-propelled'),
  machine('i1', '7-ft roadside cutter', 'implement'),
  machine('i2', '24-ft tandem disk', 'implement'),
];

describe('machine pickers', () => {
  it('puts the machine used last time on top, on its own', () => {
    const groups = machinePickerData(fleet, 'power', 't2');
    expect(groups[0]).toEqual({ group: 'Used last time', items: [{ value: 't2', label: 'Tavin’s 65 (#7)' }] });
    expect(groups[1]?.items.map((i) => i.value)).toEqual(['t1', 'c1']);
  });

  it('offers only implements for the implement and never an implement as the power unit', () => {
    expect(machinePickerData(fleet, 'implement', null).flatMap((g) => g.items.map((i) => i.value))).toEqual(['i1', 'i2']);
    expect(machinePickerData(fleet, 'power', null).flatMap((g) => g.items.map((i) => i.value))).toEqual(['t1', 't2', 'c1']);
  });

  it('ignores a remembered machine that is no longer offered', () => {
    expect(machinePickerData(fleet, 'implement', 'sold-long-ago').map((g) => g.group)).toEqual(['Implements']);
  });
});

describe('field picker', () => {
  it('groups fields by farm and puts road stretches last, with acres or miles in the label', () => {
    const groups = fieldPickerData([
      field('r1', 'Saltlick Lane ditches', 'roadside', 'Township', '1.55', '1.100'),
      field('f1', 'Home West', 'field', 'Home Place', '61.20'),
      field('f2', 'Bottom Upper', 'field', 'River Bottom', '64.30'),
    ]);
    expect(groups.map((g) => g.group)).toEqual(['Home Place', 'River Bottom', 'Road stretches']);
    expect(groups[0]?.items[0]?.label).toBe('Home West · 61.2 ac');
    expect(groups[2]?.items[0]?.label).toBe('Saltlick Lane ditches · 1.1 mi');
  });
});

describe('native picker blanks', () => {
  it('puts the blank first, choosable for an optional picker and not for a required one', () => {
    const groups = machinePickerData(fleet, 'implement', null);
    expect(withBlank(groups, 'None')).toEqual([{ value: '', label: 'None' }, ...groups]);
    expect(withBlank(groups, 'Pick the kind of work', { disabled: true })[0]).toEqual({ value: '', label: 'Pick the kind of work', disabled: true });
  });
});
