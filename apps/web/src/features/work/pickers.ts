import type { FieldDto } from '@hitchbook/shared/schemas/fields';
import type { MachineDto } from '@hitchbook/shared/schemas/machines';
import type { WorkTypeDto } from '@hitchbook/shared/schemas/work-types';
import { plainDecimal } from './entryForm';

export interface PickerItem {
  value: string;
  label: string;
  disabled?: boolean;
}

export interface PickerGroup {
  group: string;
  items: PickerItem[];
}

const machineLabel = (m: MachineDto) => (m.unitNumber ? `${m.name} (#${m.unitNumber})` : m.name);

/**
 * Machines for one picker, the one used last time on top in its own group, so a glove can take
 * it without scrolling. An implement is pulled; power units and self-propelled machines pull or drive.
 */
export function machinePickerData(machines: readonly MachineDto[], role: 'power' | 'implement', lastUsedId: string | null): PickerGroup[] {
  const fits = machines.filter((m) => (role === 'implement' ? m.kind === 'implement' : m.kind !== 'implement'));
  const last = fits.find((m) => m.id === lastUsedId);
  const rest = fits.filter((m) => m !== last).map((m) => ({ value: m.id, label: machineLabel(m) }));
  const groups: PickerGroup[] = [];
  if (last) groups.push({ group: 'Used last time', items: [{ value: last.id, label: machineLabel(last) }] });
  if (rest.length > 0) groups.push({ group: role === 'implement' ? 'Implements' : 'Tractors and self-propelled', items: rest });
  return groups;
}

/** Fields grouped by farm, road stretches together, each with its acres so the right one is easy to spot. */
export function fieldPickerData(fields: readonly FieldDto[]): PickerGroup[] {
  const groups = new Map<string, PickerGroup['items']>();
  for (const f of fields) {
    const group = f.kind === 'roadside' ? 'Road stretches' : (f.farmLabel ?? 'Other fields');
    const label = f.kind === 'roadside' ? `${f.name} · ${f.lengthMiles ? plainDecimal(f.lengthMiles) : '?'} mi` : `${f.name} · ${plainDecimal(f.acres)} ac`;
    groups.set(group, [...(groups.get(group) ?? []), { value: f.id, label }]);
  }
  return [...groups.entries()]
    .sort(([a], [b]) => (a === 'Road stretches' ? 1 : b === 'Road stretches' ? -1 : a.localeCompare(b)))
    .map(([group, items]) => ({ group, items }));
}

export function workTypePickerData(types: readonly WorkTypeDto[]): { value: string; label: string }[] {
  return types.filter((t) => !t.archived).map((t) => ({ value: t.id, label: t.name }));
}

/**
 * A native picker always shows one of its options: the empty first one stands for "none" where a
 * choice is optional, or asks for a choice (and cannot be chosen back) where one is required.
 */
export function withBlank(data: readonly (PickerItem | PickerGroup)[], label: string, { disabled = false } = {}): (PickerItem | PickerGroup)[] {
  return [{ value: '', label, ...(disabled ? { disabled } : {}) }, ...data];
}
