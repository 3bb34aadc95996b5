import { useState } from 'react';
import { ActionIcon, Anchor, Badge, Button, Group, SegmentedControl, Select, Stack, Text, Tooltip } from '@mantine/core';
import { notifications } from '@mantine/notifications';
import { IconArchive, IconArchiveOff, IconDownload, IconPencil, IconPlus, IconRoad, IconX } from '@tabler/icons-react';
import type { MRT_ColumnDef } from 'mantine-react-table';
import { useMediaQuery } from '@mantine/hooks';
import { Link } from 'react-router-dom';
import { FIELD_KINDS, type FieldDto, type FieldKind } from '@hitchbook/shared/schemas/fields';
import { EmptyState } from '../../../components/EmptyState';
import { PageHeader } from '../../../components/PageHeader';
import { ServerTable } from '../../../components/ServerTable';
import { accessTo } from '../../../lib/areas';
import { useSessionUserOrThrow } from '../../../lib/auth';
import { useListParams } from '../../../lib/listParams';
import { formatDecimal } from '../../../lib/money';
import { paths } from '../../../lib/paths';
import { exportFields } from '../api/exportFields';
import { useFields, type ArchivedFilter } from '../api/listFields';
import { useLandowners } from '../api/listLandowners';
import { ArchiveFieldModal } from '../components/ArchiveFieldModal';
import { FIELD_KIND_LABELS } from '../labels';

const ARCHIVED_FILTERS: readonly ArchivedFilter[] = ['false', 'true', 'all'];

function columnsFor(canManage: boolean, onFarmLabel: (label: string) => void): MRT_ColumnDef<FieldDto>[] {
  return [
    {
      accessorKey: 'name',
      header: 'Name',
      size: 230,
      Cell: ({ row }) => (
        <Stack gap={0}>
          {canManage ? (
            <Anchor component={Link} to={paths.editField(row.original.id)} fw={700}>
              {row.original.name}
            </Anchor>
          ) : (
            <Text fw={700}>{row.original.name}</Text>
          )}
          <Group gap={6} mt={2}>
            <Badge variant="light" color={row.original.kind === 'roadside' ? 'clay' : 'harbor'}>
              {FIELD_KIND_LABELS[row.original.kind]}
            </Badge>
            {row.original.archived && (
              <Badge variant="outline" color="slate">
                Archived
              </Badge>
            )}
          </Group>
          {row.original.kind === 'roadside' && (
            <Text size="sm" c="dimmed">
              {[row.original.roadName, row.original.roadFrom && `from ${row.original.roadFrom}`, row.original.roadTo && `to ${row.original.roadTo}`]
                .filter(Boolean)
                .join(' ')}
            </Text>
          )}
        </Stack>
      ),
    },
    {
      accessorKey: 'farmLabel',
      header: 'Farm or section',
      size: 130,
      // The server matches a farm label exactly, so the filter is picked from a row rather than typed.
      Cell: ({ row }) => {
        const label = row.original.farmLabel;
        if (!label) return '—';
        return (
          <Tooltip label={`Only ${label}`}>
            <Anchor component="button" type="button" ta="left" onClick={() => onFarmLabel(label)}>
              {label}
            </Anchor>
          </Tooltip>
        );
      },
    },
    { accessorKey: 'ownerName', header: 'Landlord or owner', size: 150, enableSorting: false, Cell: ({ row }) => row.original.ownerName ?? '—' },
    {
      accessorKey: 'acres',
      header: 'Acres',
      size: 90,
      Cell: ({ row }) => <Text style={{ fontVariantNumeric: 'tabular-nums' }}>{formatDecimal(row.original.acres, 2)}</Text>,
    },
    {
      accessorKey: 'boundaryAcres',
      header: 'Boundary acres',
      size: 110,
      enableSorting: false,
      Cell: ({ row }) =>
        row.original.boundaryAcres ? (
          <Text style={{ fontVariantNumeric: 'tabular-nums' }}>{formatDecimal(row.original.boundaryAcres, 2)}</Text>
        ) : (
          <Text c="dimmed">—</Text>
        ),
    },
  ];
}

interface CompactFieldProps {
  field: FieldDto;
  canManage: boolean;
  onFarmLabel: (label: string) => void;
  onArchive: (field: FieldDto) => void;
}

/** On a phone each field is one cell with its figures and buttons, so nothing sits off screen. */
function CompactField({ field, canManage, onFarmLabel, onArchive }: CompactFieldProps) {
  return (
    <Stack gap={4} data-testid="field-card">
      <Group justify="space-between" wrap="nowrap" align="flex-start">
        <Stack gap={2}>
          {canManage ? (
            <Anchor component={Link} to={paths.editField(field.id)} fw={700} size="lg">
              {field.name}
            </Anchor>
          ) : (
            <Text fw={700} size="lg">
              {field.name}
            </Text>
          )}
          <Group gap={6}>
            <Badge variant="light" color={field.kind === 'roadside' ? 'clay' : 'harbor'}>
              {FIELD_KIND_LABELS[field.kind]}
            </Badge>
            {field.archived && (
              <Badge variant="outline" color="slate">
                Archived
              </Badge>
            )}
          </Group>
        </Stack>
        {canManage && (
          <ActionIcon variant="subtle" color={field.archived ? undefined : 'clay'} size="xl" aria-label={`${field.archived ? 'Bring back' : 'Archive'} ${field.name}`} onClick={() => onArchive(field)}>
            {field.archived ? <IconArchiveOff /> : <IconArchive />}
          </ActionIcon>
        )}
      </Group>
      <Text fw={600} style={{ fontVariantNumeric: 'tabular-nums' }}>
        {formatDecimal(field.acres, 2)} ac{field.boundaryAcres ? ` · boundary ${formatDecimal(field.boundaryAcres, 2)} ac` : ''}
      </Text>
      <Group gap={6}>
        {field.farmLabel && (
          <Anchor component="button" type="button" size="sm" ta="left" onClick={() => onFarmLabel(field.farmLabel!)}>
            {field.farmLabel}
          </Anchor>
        )}
        {field.ownerName && (
          <Text size="sm" c="dimmed">
            {field.farmLabel ? '· ' : ''}
            {field.ownerName}
          </Text>
        )}
      </Group>
    </Stack>
  );
}

export function Component() {
  const user = useSessionUserOrThrow();
  const canManage = accessTo(user.role, 'fields') === 'manage';
  const { params, searchParams, update } = useListParams({ sort: 'name' });
  const kind = FIELD_KINDS.find((k) => k === searchParams.get('kind')) as FieldKind | undefined;
  const archived = ARCHIVED_FILTERS.find((a) => a === searchParams.get('archived')) ?? 'false';
  const farmLabel = searchParams.get('farmLabel') ?? undefined;
  const ownerPartyId = searchParams.get('ownerPartyId') ?? undefined;
  const fields = useFields({ ...params, kind, archived, farmLabel, ownerPartyId });
  const landowners = useLandowners();
  const [archiving, setArchiving] = useState<FieldDto | null>(null);
  const filtered = Boolean(params.q || kind || farmLabel || ownerPartyId || archived !== 'false');
  const phone = useMediaQuery('(max-width: 48em)') ?? false;
  const pickFarm = (label: string) => update({ farmLabel: label });
  const [exporting, setExporting] = useState(false);

  async function exportCsv() {
    setExporting(true);
    try {
      await exportFields({ q: params.q, sort: params.sort, kind, farmLabel, ownerPartyId, archived });
    } catch (error) {
      notifications.show({ color: 'red', title: 'The export did not download', message: error instanceof Error ? error.message : '' });
    } finally {
      setExporting(false);
    }
  }
  const compactColumns: MRT_ColumnDef<FieldDto>[] = [
    {
      accessorKey: 'name',
      header: 'Field',
      Cell: ({ row }) => <CompactField field={row.original} canManage={canManage} onFarmLabel={pickFarm} onArchive={setArchiving} />,
    },
  ];

  const toolbar = (
    <>
      <SegmentedControl
        aria-label="Show"
        value={kind ?? 'all'}
        onChange={(value) => update({ kind: value === 'all' ? undefined : value })}
        data={[
          { value: 'all', label: 'All' },
          { value: 'field', label: 'Fields' },
          { value: 'roadside', label: 'Road stretches' },
        ]}
      />
      {farmLabel && (
        <Button variant="light" color="slate" rightSection={<IconX size={16} />} onClick={() => update({ farmLabel: undefined })} aria-label={`Show every farm, not only ${farmLabel}`}>
          Farm: {farmLabel}
        </Button>
      )}
      <Select
        aria-label="Landlord or owner"
        placeholder="Any landlord or owner"
        clearable
        searchable
        w={240}
        value={ownerPartyId ?? null}
        onChange={(value) => update({ ownerPartyId: value ?? undefined })}
        data={(landowners.data ?? []).map((p) => ({ value: p.id, label: p.name }))}
      />
      <Select
        aria-label="Archived"
        w={220}
        allowDeselect={false}
        value={archived}
        onChange={(value) => update({ archived: value === 'false' ? undefined : (value ?? undefined) })}
        data={[
          { value: 'false', label: 'In use' },
          { value: 'true', label: 'Archived' },
          { value: 'all', label: 'In use and archived' },
        ]}
      />
    </>
  );

  return (
    <>
      <PageHeader
        title="Fields & road stretches"
        description="Where the work is done: fields with their acres and boundaries, and the road stretches mowed by the mile."
        actions={
          <Group gap="sm">
            <Button variant="default" leftSection={<IconDownload size={20} />} loading={exporting} onClick={() => void exportCsv()}>
              Export CSV{filtered ? ' of these fields' : ''}
            </Button>
            {canManage && (
              <>
                <Button component={Link} to={paths.newField()} leftSection={<IconPlus size={20} />}>
                  Add field
                </Button>
                <Button component={Link} to={paths.newField({ kind: 'roadside' })} variant="light" leftSection={<IconRoad size={20} />}>
                  Add road stretch
                </Button>
              </>
            )}
          </Group>
        }
      />
      <ServerTable
        columns={phone ? compactColumns : columnsFor(canManage, pickFarm)}
        query={fields}
        params={params}
        onParamsChange={update}
        getRowId={(field) => field.id}
        searchPlaceholder="Search by name or road"
        toolbar={toolbar}
        rowActions={
          canManage && !phone
            ? (field) => (
                <Group gap={4} wrap="nowrap">
                  <Tooltip label={`Edit ${field.name}`}>
                    <ActionIcon component={Link} to={paths.editField(field.id)} variant="subtle" size="xl" aria-label={`Edit ${field.name}`}>
                      <IconPencil />
                    </ActionIcon>
                  </Tooltip>
                  <Tooltip label={field.archived ? 'Bring back' : 'Archive'}>
                    <ActionIcon
                      variant="subtle"
                      color={field.archived ? undefined : 'clay'}
                      size="xl"
                      aria-label={`${field.archived ? 'Bring back' : 'Archive'} ${field.name}`}
                      onClick={() => setArchiving(field)}
                    >
                      {field.archived ? <IconArchiveOff /> : <IconArchive />}
                    </ActionIcon>
                  </Tooltip>
                </Group>
              )
            : undefined
        }
        emptyState={
          <EmptyState title={filtered ? 'No fields match' : 'No fields yet'}>
            {filtered ? 'Try another name or clear the filters.' : canManage ? 'Add the fields you farm and the road stretches you mow.' : 'The owner has not added any yet.'}
          </EmptyState>
        }
      />
      <ArchiveFieldModal field={archiving} onClose={() => setArchiving(null)} />
    </>
  );
}
