import type React from 'react';
import { Select, Text } from '@mantine/core';
import type { MachineClassResponse } from '@hitchbook/shared/estimates';
import type { MachineKind } from '@hitchbook/shared/machine-classes';
import { formatDecimal } from '../../../lib/money';

const KIND_GROUPS: { kind: MachineKind; label: string }[] = [
  { kind: 'power', label: 'Tractors' },
  { kind: 'self-propelled', label: 'Self-propelled' },
  { kind: 'implement', label: 'Implements' },
];

interface MachineClassSelectProps {
  classes: MachineClassResponse[] | undefined;
  loading: boolean;
  value: string;
  error: React.ReactNode;
  onChange: (machineClass: MachineClassResponse | null) => void;
}

export function MachineClassSelect({ classes, loading, value, error, onChange }: MachineClassSelectProps) {
  const data = KIND_GROUPS.map(({ kind, label }) => ({
    group: label,
    items: (classes ?? []).filter((c) => c.kind === kind).map((c) => ({ value: c.id, label: c.label })),
  })).filter((group) => group.items.length > 0);
  const selected = classes?.find((c) => c.id === value);

  return (
    <div>
      <Select
        label="Machine class"
        description="Sets the repair curve, remaining-value curve and typical field speed."
        placeholder={loading ? 'Loading classes…' : 'Pick a class'}
        data={data}
        searchable
        allowDeselect={false}
        value={value || null}
        error={error}
        onChange={(id) => onChange(classes?.find((c) => c.id === id) ?? null)}
        data-testid="machine-class"
      />
      {selected && (
        <Text size="sm" c="dimmed" mt={6}>
          Repair factors RF1 {selected.rf1}, RF2 {selected.rf2} · life {formatDecimal(selected.lifeHours, 0)} h
          {selected.fieldOperation &&
            ` · typically ${selected.fieldOperation.speedMph.typical} mph at ${selected.fieldOperation.efficiencyPct.typical} % field efficiency`}
        </Text>
      )}
    </div>
  );
}
