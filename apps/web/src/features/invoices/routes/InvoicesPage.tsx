import { Anchor, Badge, Button, Group, Select, Stack, Text, TextInput } from '@mantine/core';
import { useMediaQuery } from '@mantine/hooks';
import { IconAlertTriangle, IconPlus } from '@tabler/icons-react';
import type { MRT_ColumnDef } from 'mantine-react-table';
import { Link } from 'react-router-dom';
import { formatMoney } from '@hitchbook/shared/money';
import { INVOICE_STATES, type InvoiceState, type InvoiceSummaryDto } from '@hitchbook/shared/schemas/invoices';
import { EmptyState } from '../../../components/EmptyState';
import { PageHeader } from '../../../components/PageHeader';
import { ServerTable } from '../../../components/ServerTable';
import { useSessionUserOrThrow } from '../../../lib/auth';
import { useListParams } from '../../../lib/listParams';
import { paths } from '../../../lib/paths';
import { useCustomerOptions } from '../api/listCustomerOptions';
import { useInvoices } from '../api/listInvoices';
import { InvoiceStateBadge } from '../components/InvoiceStateBadge';
import { canBill } from '../invoiceActions';
import { hasFilters, readInvoiceFilters } from '../invoiceFilters';
import { formatDay, STATE_LABELS } from '../labels';

const money = { mantineTableHeadCellProps: { align: 'right' as const }, mantineTableBodyCellProps: { align: 'right' as const } };

const columns: MRT_ColumnDef<InvoiceSummaryDto>[] = [
  {
    id: 'number',
    header: 'Number',
    size: 120,
    accessorFn: (i) => i.numberLabel ?? 'Draft',
    Cell: ({ row }) => (
      <Stack gap={2}>
        <Anchor component={Link} to={paths.invoice(row.original.id)} fw={700} style={{ whiteSpace: 'nowrap' }}>
          {row.original.numberLabel ?? 'Draft'}
        </Anchor>
        {row.original.kind === 'credit-note' && (
          <Badge size="sm" variant="outline" color="clay">
            Credit note
          </Badge>
        )}
      </Stack>
    ),
  },
  { accessorKey: 'partyName', header: 'Customer', enableSorting: false, size: 200 },
  { id: 'issueDate', header: 'Issued', size: 130, accessorFn: (i) => i.issueDate, Cell: ({ row }) => (row.original.issueDate ? formatDay(row.original.issueDate) : '—') },
  {
    id: 'dueDate',
    header: 'Due',
    size: 140,
    accessorFn: (i) => i.dueDate,
    Cell: ({ row }) => {
      const { dueDate, state } = row.original;
      if (!dueDate) return '—';
      return state === 'overdue' ? (
        <Group gap={4} wrap="nowrap" c="red.8" fw={700}>
          <IconAlertTriangle size={16} aria-hidden />
          {formatDay(dueDate)}
        </Group>
      ) : (
        formatDay(dueDate)
      );
    },
  },
  { id: 'total', header: 'Total', size: 120, accessorFn: (i) => i.total, Cell: ({ row }) => formatMoney(row.original.total), ...money },
  {
    accessorKey: 'balance',
    header: 'Balance',
    size: 120,
    enableSorting: false,
    // A draft owes nothing yet and a void invoice nothing any more; a $0.00 there would read as "paid".
    Cell: ({ row }) =>
      row.original.status === 'issued' ? (
        <Text fw={700} size="sm" c={row.original.state === 'overdue' ? 'red.8' : undefined}>
          {formatMoney(row.original.balance)}
        </Text>
      ) : (
        '—'
      ),
    ...money,
  },
  { accessorKey: 'state', header: 'State', enableSorting: false, size: 130, Cell: ({ row }) => <InvoiceStateBadge state={row.original.state} size="md" /> },
];

/** The states in which a due date still matters to whoever reads the list. */
const OPEN_STATES: readonly InvoiceState[] = ['issued', 'partly-paid', 'overdue'];

/** On a phone the table keeps three columns that fit: what it is, whom and when it is due, what is still owed. */
const phoneColumns: MRT_ColumnDef<InvoiceSummaryDto>[] = [
  {
    id: 'number',
    header: 'Number',
    size: 110,
    accessorFn: (i) => i.numberLabel ?? 'Draft',
    Cell: ({ row }) => (
      <Stack gap={4} align="flex-start">
        <Anchor component={Link} to={paths.invoice(row.original.id)} fw={700} style={{ whiteSpace: 'nowrap' }}>
          {row.original.numberLabel ?? 'Draft'}
        </Anchor>
        <InvoiceStateBadge state={row.original.state} size="md" />
      </Stack>
    ),
  },
  {
    accessorKey: 'partyName',
    header: 'Customer',
    enableSorting: false,
    size: 140,
    Cell: ({ row }) => (
      <Stack gap={2}>
        <Text size="sm">{row.original.partyName}</Text>
        {row.original.dueDate && OPEN_STATES.includes(row.original.state) && (
          <Text size="xs" c={row.original.state === 'overdue' ? 'red.8' : 'dimmed'} fw={row.original.state === 'overdue' ? 700 : undefined}>
            Due {formatDay(row.original.dueDate)}
          </Text>
        )}
      </Stack>
    ),
  },
  {
    accessorKey: 'balance',
    header: 'Balance',
    enableSorting: false,
    size: 100,
    Cell: ({ row }) => (
      <Text fw={700} size="sm" style={{ whiteSpace: 'nowrap' }}>
        {row.original.status === 'issued' ? formatMoney(row.original.balance) : '—'}
      </Text>
    ),
    ...money,
  },
];

export function Component() {
  const user = useSessionUserOrThrow();
  const billing = canBill(user.role);
  const { params, searchParams, update } = useListParams({ sort: '-createdAt' });
  const filters = readInvoiceFilters(searchParams);
  const invoices = useInvoices({ page: params.page, pageSize: params.pageSize, sort: params.sort, ...filters });
  const customers = useCustomerOptions();
  const filtered = hasFilters(filters);
  const phone = useMediaQuery('(max-width: 48em)');

  const toolbar = (
    <>
      <Select
        label="Customer"
        placeholder="All customers"
        data={(customers.data ?? []).map((c) => ({ value: c.id, label: c.name }))}
        value={filters.partyId ?? null}
        onChange={(value) => update({ partyId: value ?? undefined })}
        searchable
        clearable
        w={{ base: '100%', xs: 260 }}
      />
      <Select
        label="State"
        placeholder="Any state"
        data={INVOICE_STATES.map((s) => ({ value: s, label: STATE_LABELS[s] }))}
        value={filters.state ?? null}
        onChange={(value) => update({ state: value ?? undefined })}
        clearable
        w={{ base: '100%', xs: 180 }}
      />
      <TextInput type="date" label="Issued from" value={filters.from ?? ''} onChange={(e) => update({ from: e.currentTarget.value })} w={{ base: '47%', xs: 170 }} />
      <TextInput type="date" label="Issued to" value={filters.to ?? ''} onChange={(e) => update({ to: e.currentTarget.value })} w={{ base: '47%', xs: 170 }} />
      {filtered && (
        <Button variant="subtle" mt={{ base: 0, xs: 26 }} onClick={() => update({ partyId: undefined, state: undefined, from: undefined, to: undefined })}>
          Clear filters
        </Button>
      )}
    </>
  );

  return (
    <>
      <PageHeader
        title="Invoices"
        description="Invoices for custom work, from approved work entries. Issued invoices are never edited: they are voided or corrected with a credit note."
        actions={
          billing && (
            <Button component={Link} to={paths.newInvoice()} leftSection={<IconPlus size={20} />}>
              New invoice
            </Button>
          )
        }
      />
      <ServerTable
        columns={phone ? phoneColumns : columns}
        query={invoices}
        params={params}
        onParamsChange={update}
        getRowId={(i) => i.id}
        toolbar={toolbar}
        emptyState={
          <EmptyState title={filtered ? 'No invoices match' : 'No invoices yet'}>
            {filtered
              ? 'Try another customer, state or dates, or clear the filters.'
              : billing
                ? 'Start one with New invoice: pick a customer and the dates of the work.'
                : 'Invoices appear here once the owner issues them.'}
          </EmptyState>
        }
      />
    </>
  );
}
