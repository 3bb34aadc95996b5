import { Anchor, Button, Select, Stack, Table, Text, TextInput } from '@mantine/core';
import { useMediaQuery } from '@mantine/hooks';
import { AUDIT_ENTITY_TYPES, type AuditEntryDto } from '@hitchbook/shared/schemas/audit';
import type { MRT_ColumnDef } from 'mantine-react-table';
import { Link } from 'react-router-dom';
import { EmptyState } from '../../../components/EmptyState';
import { PageHeader } from '../../../components/PageHeader';
import { ServerTable } from '../../../components/ServerTable';
import { useListParams } from '../../../lib/listParams';
import { paths } from '../../../lib/paths';
import { useUsers } from '../../users/api/listUsers';
import { useAudit } from '../api/listAudit';
import { describeAction, ENTITY_LABELS, hasAuditFilters, readAuditFilters } from '../auditFilters';
import { fieldLabel, valueText } from '../changeDisplay';

const when = new Intl.DateTimeFormat('en-US', { dateStyle: 'medium', timeStyle: 'short' });

/** Records that have a page of their own get a link to it. */
function entityHref(entry: AuditEntryDto): string | null {
  if (!entry.entityId) return null;
  switch (entry.entityType) {
    case 'invoice':
      return paths.invoice(entry.entityId);
    case 'machine':
      return paths.machine(entry.entityId);
    case 'rate-sheet':
      return paths.rateSheet(entry.entityId);
    case 'square-up':
      return paths.squareUp(entry.entityId);
    default:
      return null;
  }
}

function Changes({ entry }: { entry: AuditEntryDto }) {
  if (entry.changes.length === 0) return <Text c="dimmed">—</Text>;
  return (
    <Table withRowBorders={false} verticalSpacing={2} horizontalSpacing="xs" fz="sm" layout="fixed">
      <Table.Tbody>
        {entry.changes.map((c) => (
          <Table.Tr key={c.field}>
            <Table.Td fw={600} w="30%">
              {fieldLabel(c.field)}
            </Table.Td>
            <Table.Td c="dimmed" w="35%" style={{ overflowWrap: 'anywhere' }}>
              {c.before === null ? '—' : <s>{valueText(c.before)}</s>}
            </Table.Td>
            <Table.Td w="35%" style={{ overflowWrap: 'anywhere' }}>
              {valueText(c.after)}
            </Table.Td>
          </Table.Tr>
        ))}
      </Table.Tbody>
    </Table>
  );
}

function Actor({ entry }: { entry: AuditEntryDto }) {
  return entry.actor ? (
    <Stack gap={0}>
      <Text fw={600}>{entry.actor.name}</Text>
      <Text size="sm" c="dimmed">
        {entry.actor.email}
      </Text>
    </Stack>
  ) : (
    // Card payments and webhooks are booked by the payment provider's message, not by a person.
    <Text c="dimmed">System</Text>
  );
}

function What({ entry }: { entry: AuditEntryDto }) {
  const href = entityHref(entry);
  const label = describeAction(entry.action);
  return href ? (
    <Anchor component={Link} to={href} fw={600}>
      {label}
    </Anchor>
  ) : (
    <Text fw={600}>{label}</Text>
  );
}

/** On a phone each change is one card: when and who on top, then what and the fields it touched. */
const phoneColumns: MRT_ColumnDef<AuditEntryDto>[] = [
  {
    id: 'entry',
    header: 'Change',
    enableSorting: false,
    Cell: ({ row }) => (
      <Stack gap={6}>
        <Text size="sm" c="dimmed">
          {when.format(new Date(row.original.at))}
        </Text>
        <Actor entry={row.original} />
        <What entry={row.original} />
        <Changes entry={row.original} />
      </Stack>
    ),
  },
];

const columns: MRT_ColumnDef<AuditEntryDto>[] = [
  { accessorKey: 'at', header: 'When', enableSorting: false, size: 150, Cell: ({ row }) => when.format(new Date(row.original.at)) },
  { id: 'actor', header: 'Who', enableSorting: false, size: 170, Cell: ({ row }) => <Actor entry={row.original} /> },
  { accessorKey: 'action', header: 'What', enableSorting: false, size: 200, Cell: ({ row }) => <What entry={row.original} /> },
  { id: 'changes', header: 'Before → after', enableSorting: false, size: 420, Cell: ({ row }) => <Changes entry={row.original} /> },
];

export function Component() {
  const { params, searchParams, update } = useListParams({ pageSize: 25 });
  const filters = readAuditFilters(searchParams);
  const audit = useAudit({ page: params.page, pageSize: params.pageSize, ...filters });
  const members = useUsers({ page: 1, pageSize: 100, sort: undefined, q: undefined });
  const filtered = hasAuditFilters(filters);
  const phone = useMediaQuery('(max-width: 48em)');

  const toolbar = (
    <>
      <Select
        label="Kind of record"
        placeholder="Everything"
        data={AUDIT_ENTITY_TYPES.map((t) => ({ value: t, label: ENTITY_LABELS[t] }))}
        value={filters.entityType ?? null}
        onChange={(value) => update({ entityType: value ?? undefined })}
        clearable
        w={{ base: '100%', xs: 220 }}
      />
      <Select
        label="Changed by"
        placeholder="Anyone"
        data={(members.data?.items ?? []).map((m) => ({ value: m.userId, label: m.name }))}
        value={filters.actorUserId ?? null}
        onChange={(value) => update({ actorUserId: value ?? undefined })}
        searchable
        clearable
        w={{ base: '100%', xs: 220 }}
      />
      <TextInput type="date" label="From" value={filters.from ?? ''} onChange={(e) => update({ from: e.currentTarget.value })} w={{ base: '47%', xs: 170 }} />
      <TextInput type="date" label="To" value={filters.to ?? ''} onChange={(e) => update({ to: e.currentTarget.value })} w={{ base: '47%', xs: 170 }} />
      {filtered && (
        <Button variant="subtle" mt={{ base: 0, xs: 26 }} onClick={() => update({ entityType: undefined, actorUserId: undefined, from: undefined, to: undefined })}>
          Clear filters
        </Button>
      )}
    </>
  );

  return (
    <>
      <PageHeader
        title="Audit log"
        description="Who changed what and when: work entries, rates, invoices, payments, machine shares and roles, newest first. Nothing here can be edited or removed."
      />
      <ServerTable
        columns={phone ? phoneColumns : columns}
        query={audit}
        params={params}
        onParamsChange={update}
        getRowId={(e) => e.id}
        toolbar={toolbar}
        emptyState={
          <EmptyState title={filtered ? 'Nothing matches' : 'Nothing recorded yet'}>
            {filtered ? 'Try another kind of record, person or dates, or clear the filters.' : 'Changes appear here as soon as someone makes them.'}
          </EmptyState>
        }
      />
    </>
  );
}
