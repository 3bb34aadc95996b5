import { Anchor, Badge, Group, Paper, Stack, Text, Title } from '@mantine/core';
import type { MRT_ColumnDef } from 'mantine-react-table';
import { Link } from 'react-router-dom';
import type { WorkEntryDto } from '@hitchbook/shared/schemas/work-entries';
import { EmptyState } from '../../../components/EmptyState';
import { ServerTable } from '../../../components/ServerTable';
import { formatDecimal } from '../../../lib/money';
import { paths } from '../../../lib/paths';
import { useMachineEntries } from '../api/listMachineEntries';
import { ENTRY_STATE_LABELS } from '../labels';
import { useSectionParams } from '../sectionParams';

const dateColumn: MRT_ColumnDef<WorkEntryDto> = { id: 'date', accessorKey: 'workDate', header: 'Date', size: 120 };
const operatorColumn: MRT_ColumnDef<WorkEntryDto> = { id: 'operator', accessorKey: 'operatorName', header: 'Operator', size: 150 };

const otherColumns: MRT_ColumnDef<WorkEntryDto>[] = [
  { id: 'field', accessorKey: 'fieldName', header: 'Field', size: 150 },
  { accessorKey: 'workTypeName', header: 'Work', size: 140, enableSorting: false },
  { id: 'hours', accessorKey: 'hours', header: 'Hours', size: 90, Cell: ({ row }) => formatDecimal(row.original.hours, 2) },
  { id: 'acres', accessorKey: 'acres', header: 'Acres', size: 90, Cell: ({ row }) => (row.original.acres ? formatDecimal(row.original.acres, 1) : '—') },
  {
    id: 'state',
    accessorKey: 'state',
    header: 'State',
    size: 110,
    Cell: ({ row }) => (
      <Badge variant="light" color={row.original.state === 'draft' ? 'slate' : row.original.state === 'submitted' ? 'clay' : 'harbor'}>
        {ENTRY_STATE_LABELS[row.original.state]}
      </Badge>
    ),
  },
];

/** An operator's list holds only their own entries (the server scopes it), so it needs no operator column. */
export function MachineEntriesPanel({ machineId, showOperator }: { machineId: string; showOperator: boolean }) {
  const columns = showOperator ? [dateColumn, operatorColumn, ...otherColumns] : [dateColumn, ...otherColumns];
  const { params, update } = useSectionParams('entries', { sort: '-date', pageSize: 10 });
  const entries = useMachineEntries({ machineId, page: params.page, pageSize: params.pageSize, sort: params.sort });
  return (
    <Paper withBorder p="md" radius="md" data-testid="machine-entries">
      <Stack gap="md">
        <Group justify="space-between">
          <Title order={2} size="h4">
            Work entries
          </Title>
          <Anchor component={Link} to={paths.work.entries({ machineId })}>
            Open in the work table
          </Anchor>
        </Group>
        <ServerTable
          columns={columns}
          query={entries}
          params={params}
          onParamsChange={update}
          getRowId={(entry) => entry.id}
          emptyState={<EmptyState title="No work logged with this machine" />}
        />
        {entries.data && entries.data.total > 0 && (
          <Text fw={700} ta="right">
            {formatDecimal(entries.data.totals.hours, 1)} h · {formatDecimal(entries.data.totals.acres, 1)} acres
          </Text>
        )}
      </Stack>
    </Paper>
  );
}
