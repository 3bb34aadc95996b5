import { useState } from 'react';
import { ActionIcon, Badge, Button, SegmentedControl, Text, Tooltip } from '@mantine/core';
import { IconPencil, IconPlus } from '@tabler/icons-react';
import type { MRT_ColumnDef } from 'mantine-react-table';
import { EmptyState } from '../../../components/EmptyState';
import { PageHeader } from '../../../components/PageHeader';
import { ServerTable } from '../../../components/ServerTable';
import { accessTo } from '../../../lib/areas';
import { useSessionUserOrThrow } from '../../../lib/auth';
import { useListParams } from '../../../lib/listParams';
import { useParties, type Party, type PartyKind } from '../api/listParties';
import { PartyFormModal } from '../components/PartyFormModal';
import { KIND_LABELS, RELATIONSHIP_LABELS } from '../labels';

function readKind(raw: string | null): PartyKind | undefined {
  return raw === 'household' || raw === 'customer' ? raw : undefined;
}

const columns: MRT_ColumnDef<Party>[] = [
  { accessorKey: 'name', header: 'Name', Cell: ({ row }) => <Text fw={700}>{row.original.name}</Text> },
  {
    accessorKey: 'kind',
    header: 'Kind',
    Cell: ({ row }) => (
      <Badge color={row.original.kind === 'household' ? 'harbor' : 'clay'} variant="light" size="lg">
        {KIND_LABELS[row.original.kind]}
      </Badge>
    ),
  },
  {
    accessorKey: 'relationship',
    header: 'Relationship',
    enableSorting: false,
    Cell: ({ row }) => RELATIONSHIP_LABELS[row.original.relationship],
  },
  { accessorKey: 'email', header: 'E-mail', enableSorting: false, Cell: ({ row }) => row.original.email ?? '—' },
  { accessorKey: 'phone', header: 'Phone', enableSorting: false, Cell: ({ row }) => row.original.phone ?? '—' },
];

export function Component() {
  const user = useSessionUserOrThrow();
  const canManage = accessTo(user.role, 'parties') === 'manage';
  const { params, searchParams, update } = useListParams({ sort: 'name' });
  const kind = readKind(searchParams.get('kind'));
  const parties = useParties({ ...params, kind });
  const [editing, setEditing] = useState<{ party: Party | null } | null>(null);

  const kindFilter = (
    <SegmentedControl
      aria-label="Show"
      value={kind ?? 'all'}
      onChange={(value) => update({ kind: value === 'all' ? undefined : value })}
      data={[
        { value: 'all', label: 'All' },
        { value: 'household', label: 'Households' },
        { value: 'customer', label: 'Customers' },
      ]}
    />
  );

  return (
    <>
      <PageHeader
        title="Households & customers"
        description="Households share the machines and square up; customers are billed for custom work."
        actions={
          canManage && (
            <Button leftSection={<IconPlus size={20} />} onClick={() => setEditing({ party: null })}>
              Add party
            </Button>
          )
        }
      />
      <ServerTable
        columns={columns}
        query={parties}
        params={params}
        onParamsChange={update}
        getRowId={(party) => party.id}
        searchPlaceholder="Search by name"
        toolbar={kindFilter}
        rowActions={
          canManage
            ? (party) => (
                <Tooltip label={`Edit ${party.name}`}>
                  <ActionIcon
                    variant="subtle"
                    size="xl"
                    aria-label={`Edit ${party.name}`}
                    onClick={() => setEditing({ party })}
                  >
                    <IconPencil />
                  </ActionIcon>
                </Tooltip>
              )
            : undefined
        }
        emptyState={
          <EmptyState title={params.q || kind ? 'No parties match' : 'No households or customers yet'}>
            {params.q || kind
              ? 'Try another name, or show all kinds.'
              : canManage
                ? 'Add the households of the family outfit first, then the neighbours and agencies you work for.'
                : 'The owner has not added any yet.'}
          </EmptyState>
        }
      />
      <PartyFormModal
        opened={editing !== null}
        party={editing?.party ?? null}
        defaultKind={kind ?? 'household'}
        onClose={() => setEditing(null)}
      />
    </>
  );
}
