import { Select, type SelectProps } from '@mantine/core';
import { MACHINE_CLASSES } from '@hitchbook/shared/machine-classes';
import { KIND_LABELS } from '../labels';

const KINDS = ['power', 'self-propelled', 'implement'] as const;

// The engine's classes are part of the shared package, so the list needs no request.
const CLASS_GROUPS = KINDS.map((kind) => ({
  group: KIND_LABELS[kind],
  items: MACHINE_CLASSES.filter((c) => c.kind === kind).map((c) => ({ value: c.id, label: c.label })),
}));

export function MachineClassSelect(props: Omit<SelectProps, 'data'>) {
  return <Select data={CLASS_GROUPS} searchable allowDeselect={false} {...props} />;
}
