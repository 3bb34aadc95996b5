import { useState } from 'react';
import { Anchor, Badge, Button, Group, Select, Stack, Text } from '@mantine/core';
import { useMediaQuery } from '@mantine/hooks';
import { notifications } from '@mantine/notifications';
import { IconDownload, IconPlus } from '@tabler/icons-react';
import type { MRT_ColumnDef } from 'mantine-react-table';
import { Link } from 'react-router-dom';
import { MACHINE_CLASSES, type MachineKind } from '@hitchbook/shared/machine-classes';
import { MACHINE_KINDS, MACHINE_STATUSES, type MachineDto, type MachineStatus } from '@hitchbook/shared/schemas/machines';
import { EmptyState } from '../../../components/EmptyState';
import { PageHeader } from '../../../components/PageHeader';
import { ServerTable } from '../../../components/ServerTable';
import { accessTo } from '../../../lib/areas';
import { useSessionUserOrThrow } from '../../../lib/auth';
import { useListParams } from '../../../lib/listParams';
import { paths } from '../../../lib/paths';
import { exportMachines } from '../api/exportMachines';
import { useMachines } from '../api/listMachines';
import { MachineClassSelect } from '../components/MachineClassSelect';
import { MachineHours } from '../components/MachineHours';
import { OwnersList } from '../components/OwnersList';
import { KIND_LABELS, STATUS_COLORS, STATUS_LABELS } from '../labels';

function oneOf<T extends string>(values: readonly T[], raw: string | null): T | undefined {
  return values.find((v) => v === raw);
}

const CLASS_IDS = MACHINE_CLASSES.map((c) => c.id);

const columns: MRT_ColumnDef<MachineDto>[] = [
  {
    accessorKey: 'name',
    header: 'Name',
    Cell: ({ row }) => (
      <Anchor component={Link} to={paths.machine(row.original.id)} fw={700}>
        {row.original.name}
      </Anchor>
    ),
  },
  {
    accessorKey: 'classId',
    header: 'Class and kind',
    Cell: ({ row }) => (
      <Stack gap={0}>
        <Text size="sm">{row.original.classLabel}</Text>
        <Text size="sm" c="dimmed">
          {KIND_LABELS[row.original.kind]}
        </Text>
      </Stack>
    ),
  },
  { id: 'owners', header: 'Owners', enableSorting: false, Cell: ({ row }) => <OwnersList owners={row.original.owners} /> },
  {
    accessorKey: 'status',
    header: 'Status',
    Cell: ({ row }) => (
      <Badge variant="light" size="lg" color={STATUS_COLORS[row.original.status]}>
        {STATUS_LABELS[row.original.status]}
      </Badge>
    ),
  },
  { id: 'hours', header: 'Hour meter', enableSorting: false, Cell: ({ row }) => <MachineHours reading={row.original.lastReading} /> },
];

/** On a phone each machine is one cell, so nothing a person needs sits off screen. */
const compactColumns: MRT_ColumnDef<MachineDto>[] = [
  {
    accessorKey: 'name',
    header: 'Machine',
    Cell: ({ row }) => {
      const m = row.original;
      return (
        <Stack gap={4} data-testid="machine-card">
          <Group justify="space-between" wrap="nowrap" align="flex-start">
            <Anchor component={Link} to={paths.machine(m.id)} fw={700} size="lg">
              {m.name}
            </Anchor>
            <Badge variant="light" color={STATUS_COLORS[m.status]}>
              {STATUS_LABELS[m.status]}
            </Badge>
          </Group>
          <Text size="sm" c="dimmed">
            {m.classLabel} · {KIND_LABELS[m.kind]}
          </Text>
          <OwnersList owners={m.owners} />
          {m.kind !== 'implement' && <MachineHours reading={m.lastReading} />}
        </Stack>
      );
    },
  },
];

export function Component() {
  const user = useSessionUserOrThrow();
  const canManage = accessTo(user.role, 'machines') === 'manage';
  const { params, searchParams, update } = useListParams({ sort: 'name' });
  const status = oneOf<MachineStatus>(MACHINE_STATUSES, searchParams.get('status'));
  const kind = oneOf<MachineKind>(MACHINE_KINDS, searchParams.get('kind'));
  const classId = oneOf(CLASS_IDS, searchParams.get('classId'));
  const machines = useMachines({ ...params, status, kind, classId });
  const filtered = Boolean(params.q || status || kind || classId);
  const phone = useMediaQuery('(max-width: 48em)') ?? false;
  const [exporting, setExporting] = useState(false);

  async function exportCsv() {
    setExporting(true);
    try {
      await exportMachines({ q: params.q, sort: params.sort, status, kind, classId });
    } catch (error) {
      notifications.show({ color: 'red', title: 'The export did not download', message: error instanceof Error ? error.message : '' });
    } finally {
      setExporting(false);
    }
  }

  const toolbar = (
    <>
      <Select
        aria-label="Status"
        placeholder="Any status"
        clearable
        w={170}
        value={status ?? null}
        onChange={(value) => update({ status: value ?? undefined })}
        data={MACHINE_STATUSES.map((s) => ({ value: s, label: STATUS_LABELS[s] }))}
      />
      <Select
        aria-label="Kind"
        placeholder="Any kind"
        clearable
        w={190}
        value={kind ?? null}
        onChange={(value) => update({ kind: value ?? undefined })}
        data={MACHINE_KINDS.map((k) => ({ value: k, label: KIND_LABELS[k] }))}
      />
      <MachineClassSelect
        aria-label="Class"
        placeholder="Any class"
        clearable
        allowDeselect
        w={280}
        value={classId ?? null}
        onChange={(value) => update({ classId: value ?? undefined })}
      />
    </>
  );

  return (
    <>
      <PageHeader
        title="Machines"
        description="Power units, self-propelled machines and implements, with who owns what share."
        actions={
          <Group gap="sm">
            <Button variant="default" leftSection={<IconDownload size={20} />} loading={exporting} onClick={() => void exportCsv()}>
              Export CSV{filtered ? ' of these machines' : ''}
            </Button>
            {canManage && (
              <Button component={Link} to={paths.newMachine()} leftSection={<IconPlus size={20} />}>
                Add machine
              </Button>
            )}
          </Group>
        }
      />
      <ServerTable
        columns={phone ? compactColumns : columns}
        query={machines}
        params={params}
        onParamsChange={update}
        getRowId={(machine) => machine.id}
        searchPlaceholder="Search by name, make or unit number"
        toolbar={toolbar}
        emptyState={
          <EmptyState title={filtered ? 'No machines match' : 'No machines yet'}>
            {filtered ? 'Try another name or clear the filters.' : canManage ? 'Add the tractors and implements the family shares.' : 'The owner has not added any yet.'}
          </EmptyState>
        }
      />
    </>
  );
}
