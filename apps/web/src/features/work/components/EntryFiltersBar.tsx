import { Button, MultiSelect, Select, Text, TextInput } from '@mantine/core';
import { IconX } from '@tabler/icons-react';
import type { Role } from '@hitchbook/shared/roles';
import { WORK_ENTRY_STATES } from '@hitchbook/shared/schemas/work-entries';
import type { WorkEntryFilters } from '../api/listWorkEntries';
import { CLEARED_FILTERS, hasFilters } from '../entryFilters';
import { STATE_LABELS } from '../labels';
import { fieldPickerData, machinePickerData } from '../pickers';
import { useBillToParties, useFieldOptions, useMachineOptions, useOperators, useWorkTypes } from '../api/entryOptionQueries';
import { MEMBER_READERS } from '../api/listMembers';

interface EntryFiltersBarProps {
  role: Role;
  filters: WorkEntryFilters;
  /** Name of the operator filtered on, when it was picked from a row rather than the list. */
  operatorName: string | null;
  update: (patch: Record<string, string | undefined>) => void;
}

export function EntryFiltersBar({ role, filters, operatorName, update }: EntryFiltersBarProps) {
  const machines = useMachineOptions();
  const fields = useFieldOptions();
  const workTypes = useWorkTypes();
  const parties = useBillToParties();
  const operators = useOperators(role);
  const machineData = [...machinePickerData(machines.data ?? [], 'power', null), ...machinePickerData(machines.data ?? [], 'implement', null)];
  const set = (key: string) => (value: string | null) => update({ [key]: value ?? undefined });

  return (
    <>
      <TextInput
        aria-label="From"
        type="date"
        w={200}
        leftSection={<Text size="sm" c="dimmed">From</Text>}
        leftSectionWidth={52}
        value={filters.dateFrom ?? ''}
        onChange={(e) => update({ dateFrom: e.currentTarget.value || undefined })}
      />
      <TextInput
        aria-label="To"
        type="date"
        w={190}
        leftSection={<Text size="sm" c="dimmed">To</Text>}
        leftSectionWidth={36}
        value={filters.dateTo ?? ''}
        onChange={(e) => update({ dateTo: e.currentTarget.value || undefined })}
      />
      <MultiSelect
        aria-label="State"
        placeholder={filters.states.length === 0 ? 'Any state' : undefined}
        w={260}
        clearable
        data={WORK_ENTRY_STATES.map((s) => ({ value: s, label: STATE_LABELS[s] }))}
        value={filters.states}
        onChange={(states) => update({ state: states.length > 0 ? states.join(',') : undefined })}
      />
      <Select aria-label="Machine" placeholder="Any machine" searchable clearable w={230} data={machineData} value={filters.machineId ?? null} onChange={set('machineId')} />
      <Select
        aria-label="Field"
        placeholder="Any field"
        searchable
        clearable
        w={230}
        data={fieldPickerData(fields.data ?? [])}
        value={filters.fieldId ?? null}
        onChange={set('fieldId')}
      />
      <Select
        aria-label="Work"
        placeholder="Any work"
        searchable
        clearable
        w={210}
        data={(workTypes.data ?? []).map((t) => ({ value: t.id, label: t.name }))}
        value={filters.workTypeId ?? null}
        onChange={set('workTypeId')}
      />
      <Select
        aria-label="Bill to"
        placeholder="Billed to anyone"
        searchable
        clearable
        w={230}
        data={(parties.data ?? []).map((p) => ({ value: p.id, label: p.name }))}
        value={filters.billToPartyId ?? null}
        onChange={set('billToPartyId')}
      />
      {MEMBER_READERS.includes(role) ? (
        <Select
          aria-label="Operator"
          placeholder="Any operator"
          searchable
          clearable
          w={210}
          data={(operators.data ?? []).map((m) => ({ value: m.userId, label: m.name }))}
          value={filters.operatorUserId ?? null}
          onChange={set('operatorUserId')}
        />
      ) : (
        // Roles that cannot read the members list filter by picking an operator's name in a row.
        filters.operatorUserId && (
          <Button variant="light" color="slate" rightSection={<IconX size={16} />} onClick={() => update({ operatorUserId: undefined })}>
            Operator: {operatorName ?? 'picked'}
          </Button>
        )
      )}
      {hasFilters(filters) && (
        <Button variant="subtle" color="slate" leftSection={<IconX size={16} />} onClick={() => update({ ...CLEARED_FILTERS })}>
          Clear filters
        </Button>
      )}
    </>
  );
}
