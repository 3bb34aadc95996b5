import type { ReactNode } from 'react';
import { Anchor, Badge, Checkbox, Group, Stack, Text } from '@mantine/core';
import type { MRT_ColumnDef } from 'mantine-react-table';
import type { WorkEntryDto, WorkEntryPage } from '@hitchbook/shared/schemas/work-entries';
import { formatDecimal } from '../../../lib/money';
import { STATE_COLORS, STATE_LABELS } from '../labels';

const NUMBER = { fontVariantNumeric: 'tabular-nums', whiteSpace: 'nowrap' } as const;

const quantity = (value: string | null, places: number) => (value ? formatDecimal(value, places) : '—');

/** A column total over every entry the filters match, not only this page. */
function Total({ value, unit }: { value: string | undefined; unit: string }) {
  return (
    <Text fw={700} style={NUMBER} data-testid={`total-${unit}`}>
      {value ? `${formatDecimal(value, 1)} ${unit}` : ''}
    </Text>
  );
}

export interface EntryColumnsOptions {
  totals: WorkEntryPage['totals'] | undefined;
  /** Approvers tick submitted entries to approve them together. */
  selection: {
    selected: ReadonlySet<string>;
    selectable: readonly WorkEntryDto[];
    toggle: (entry: WorkEntryDto) => void;
    toggleAll: () => void;
  } | null;
  showOperator: boolean;
  onOperator: (entry: WorkEntryDto) => void;
  /** On a phone every entry is one cell with its buttons inside, so nothing hides off screen. */
  compact: { actions: (entry: WorkEntryDto) => ReactNode } | null;
}

function CompactEntry({ entry, showOperator, actions }: { entry: WorkEntryDto; showOperator: boolean; actions: ReactNode }) {
  const machines = [entry.powerMachineName, entry.implementMachineName].filter(Boolean).join(' + ');
  return (
    <Stack gap={4} data-testid="entry-card" data-entry-id={entry.id}>
      <Group justify="space-between" wrap="nowrap" align="flex-start">
        <Stack gap={2}>
          <Group gap="xs">
            <Text fw={700} style={NUMBER}>
              {entry.workDate}
            </Text>
            <Badge variant="light" tt="none" size="md" color={STATE_COLORS[entry.state]} data-testid="entry-state">
              {STATE_LABELS[entry.state]}
            </Badge>
          </Group>
          <Text fw={600}>
            {entry.workTypeName} · {entry.fieldName}
          </Text>
        </Stack>
        {actions}
      </Group>
      <Text size="sm" style={NUMBER}>
        {formatDecimal(entry.hours, 2)} h{entry.acres ? ` · ${formatDecimal(entry.acres, 2)} ac` : ''}
        {entry.miles ? ` · ${formatDecimal(entry.miles, 2)} mi` : ''}
      </Text>
      <Text size="sm" c="dimmed">
        {[showOperator ? entry.operatorName : null, machines || null, `for ${entry.billToName}`].filter(Boolean).join(' · ')}
      </Text>
    </Stack>
  );
}

export function entryColumns({ totals, selection, showOperator, onOperator, compact }: EntryColumnsOptions): MRT_ColumnDef<WorkEntryDto>[] {
  const columns: MRT_ColumnDef<WorkEntryDto>[] = [];
  if (selection) {
    const all = selection.selectable.length > 0 && selection.selectable.every((e) => selection.selected.has(e.id));
    const some = selection.selectable.some((e) => selection.selected.has(e.id));
    columns.push({
      id: 'select',
      header: 'Select',
      size: 56,
      enableSorting: false,
      Header: () => (
        <Checkbox
          size="md"
          aria-label="Select every submitted entry on this page"
          checked={all}
          indeterminate={some && !all}
          disabled={selection.selectable.length === 0}
          onChange={selection.toggleAll}
        />
      ),
      Cell: ({ row }) =>
        row.original.state === 'submitted' ? (
          <Checkbox
            size="md"
            aria-label={`Select the entry of ${row.original.workDate} on ${row.original.fieldName}`}
            checked={selection.selected.has(row.original.id)}
            onChange={() => selection.toggle(row.original)}
          />
        ) : null,
    });
  }
  if (compact) {
    columns.push({
      id: 'date',
      accessorKey: 'workDate',
      header: 'Date',
      Cell: ({ row }) => <CompactEntry entry={row.original} showOperator={showOperator} actions={compact.actions(row.original)} />,
      Footer: () => (
        <Group gap="md">
          <Total value={totals?.hours} unit="h" />
          <Total value={totals?.acres} unit="ac" />
          <Total value={totals?.miles} unit="mi" />
        </Group>
      ),
    });
    return columns;
  }
  columns.push({
    id: 'date',
    accessorKey: 'workDate',
    header: 'Date',
    size: 100,
    // The state sits under the date: it is what an approver scans for, and a column of its own does not fit a laptop.
    Cell: ({ row }) => (
      <Stack gap={4} align="flex-start" data-entry-id={row.original.id}>
        <Text size="sm" style={NUMBER}>
          {row.original.workDate}
        </Text>
        <Badge variant="light" tt="none" size="md" color={STATE_COLORS[row.original.state]} data-testid="entry-state">
          {STATE_LABELS[row.original.state]}
        </Badge>
      </Stack>
    ),
  });
  if (showOperator) {
    columns.push({
      id: 'operator',
      accessorKey: 'operatorName',
      header: 'Operator',
      size: 110,
      Cell: ({ row }) => (
        <Anchor component="button" type="button" size="sm" ta="left" onClick={() => onOperator(row.original)}>
          {row.original.operatorName}
        </Anchor>
      ),
    });
  }
  columns.push(
    {
      id: 'field',
      accessorKey: 'fieldName',
      header: 'Field',
      size: 150,
      Cell: ({ row }) => (
        <Stack gap={0}>
          <Text size="sm" fw={600}>
            {row.original.fieldName}
          </Text>
          <Text size="sm" c="dimmed">
            for {row.original.billToName}
          </Text>
        </Stack>
      ),
    },
    {
      id: 'machine',
      accessorKey: 'powerMachineName',
      header: 'Work',
      size: 160,
      Cell: ({ row }) => (
        <Stack gap={0}>
          <Text size="sm">{row.original.workTypeName}</Text>
          <Text size="sm" c="dimmed">
            {[row.original.powerMachineName, row.original.implementMachineName].filter(Boolean).join(' + ') || 'No machine'}
          </Text>
        </Stack>
      ),
    },
    {
      id: 'hours',
      accessorKey: 'hours',
      header: 'Hours',
      size: 80,
      Cell: ({ row }) => <Text size="sm" style={NUMBER}>{formatDecimal(row.original.hours, 2)}</Text>,
      Footer: () => <Total value={totals?.hours} unit="h" />,
    },
    {
      id: 'acres',
      accessorKey: 'acres',
      header: 'Acres',
      size: 90,
      // Miles ride under the acres: only road stretches have them, and a column of dashes would not fit.
      Cell: ({ row }) => (
        <Stack gap={0}>
          <Text size="sm" style={NUMBER}>
            {quantity(row.original.acres, 2)}
          </Text>
          {row.original.miles && (
            <Text size="sm" c="dimmed" style={NUMBER}>
              {formatDecimal(row.original.miles, 2)} mi
            </Text>
          )}
        </Stack>
      ),
      Footer: () => (
        <Stack gap={0}>
          <Total value={totals?.acres} unit="ac" />
          <Total value={totals?.miles} unit="mi" />
        </Stack>
      ),
    },
  );
  return columns;
}
