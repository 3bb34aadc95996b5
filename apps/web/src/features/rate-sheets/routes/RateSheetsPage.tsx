import { Anchor, Badge, Button, SegmentedControl, Stack, Switch, Text } from '@mantine/core';
import { IconPlus } from '@tabler/icons-react';
import type { MRT_ColumnDef } from 'mantine-react-table';
import { Link } from 'react-router-dom';
import { RATE_RELATIONSHIPS, type RateRelationship, type RateSheetListItemDto } from '@hitchbook/shared/schemas/rate-sheets';
import { formatMoney } from '@hitchbook/shared/money';
import { EmptyState } from '../../../components/EmptyState';
import { PageHeader } from '../../../components/PageHeader';
import { ServerTable } from '../../../components/ServerTable';
import { accessTo } from '../../../lib/areas';
import { useSessionUserOrThrow } from '../../../lib/auth';
import { useListParams } from '../../../lib/listParams';
import { paths } from '../../../lib/paths';
import { useRateSheets } from '../api/listRateSheets';
import { formatDay, MINIMUM_PER_LABELS, RELATIONSHIP_COLORS, RELATIONSHIP_LABELS, RELATIONSHIP_PARTIES, SHEET_CHANGE_NOTE } from '../labels';

function readRelationship(raw: string | null): RateRelationship | undefined {
  return (RATE_RELATIONSHIPS as readonly string[]).includes(raw ?? '') ? (raw as RateRelationship) : undefined;
}

const columns: MRT_ColumnDef<RateSheetListItemDto>[] = [
  {
    accessorKey: 'name',
    header: 'Sheet',
    Cell: ({ row }) => (
      <Stack gap={2}>
        <Anchor component={Link} to={paths.rateSheet(row.original.id)} fw={700}>
          {row.original.name}
        </Anchor>
        {row.original.archivedAt && (
          <Badge color="slate" variant="outline" size="sm">
            Archived
          </Badge>
        )}
      </Stack>
    ),
  },
  {
    accessorKey: 'relationship',
    header: 'Prices work for',
    enableSorting: false,
    Cell: ({ row }) => (
      <Stack gap={4} align="flex-start">
        <Badge color={RELATIONSHIP_COLORS[row.original.relationship]} variant="light">
          {RELATIONSHIP_LABELS[row.original.relationship]}
        </Badge>
        <Text size="sm">{row.original.partyName ? `${row.original.partyName} only` : RELATIONSHIP_PARTIES[row.original.relationship]}</Text>
      </Stack>
    ),
  },
  { accessorKey: 'effectiveFrom', header: 'In force from', Cell: ({ row }) => formatDay(row.original.effectiveFrom) },
  { accessorKey: 'lineCount', header: 'Rates', enableSorting: false },
  {
    accessorKey: 'minimumCharge',
    header: 'Minimum',
    enableSorting: false,
    Cell: ({ row }) =>
      row.original.minimumCharge === '0.00'
        ? '—'
        : `${formatMoney(row.original.minimumCharge)} ${MINIMUM_PER_LABELS[row.original.minimumPer]}`,
  },
  { accessorKey: 'termsDays', header: 'Due in', enableSorting: false, Cell: ({ row }) => `${row.original.termsDays} days` },
];

export function Component() {
  const user = useSessionUserOrThrow();
  const canManage = accessTo(user.role, 'rates') === 'manage';
  const { params, searchParams, update } = useListParams({ sort: '-effectiveFrom' });
  const relationship = readRelationship(searchParams.get('relationship'));
  const includeArchived = searchParams.get('archived') === 'true';
  const sheets = useRateSheets({ page: params.page, pageSize: params.pageSize, sort: params.sort, relationship, includeArchived });

  const filters = (
    <>
      <SegmentedControl
        aria-label="Relationship"
        value={relationship ?? 'all'}
        onChange={(value) => update({ relationship: value === 'all' ? undefined : value })}
        data={[{ value: 'all', label: 'All' }, ...RATE_RELATIONSHIPS.map((r) => ({ value: r, label: RELATIONSHIP_LABELS[r] }))]}
      />
      <Switch
        label="Show archived sheets"
        checked={includeArchived}
        onChange={(event) => update({ archived: event.currentTarget.checked ? 'true' : undefined })}
      />
    </>
  );

  return (
    <>
      <PageHeader
        title="Rate sheets"
        description={`Which rates price a party's work: the sheet for its relationship in force on the day of the work, or a sheet made for that party alone. ${SHEET_CHANGE_NOTE}`}
        actions={
          canManage && (
            <Button component={Link} to={paths.newRateSheet()} leftSection={<IconPlus size={20} />}>
              New rate sheet
            </Button>
          )
        }
      />
      <ServerTable
        columns={columns}
        query={sheets}
        params={params}
        onParamsChange={update}
        getRowId={(sheet) => sheet.id}
        toolbar={filters}
        emptyState={
          <EmptyState title={relationship ? 'No sheets for this relationship' : 'No rate sheets yet'}>
            {canManage
              ? 'Add a sheet for each relationship you work for: family, neighbours, public agencies.'
              : 'The owner has not set up any rate sheets yet.'}
          </EmptyState>
        }
      />
    </>
  );
}
