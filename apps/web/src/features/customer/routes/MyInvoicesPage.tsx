import { Anchor, Stack, Text } from '@mantine/core';
import { useMediaQuery } from '@mantine/hooks';
import type { MRT_ColumnDef } from 'mantine-react-table';
import { Link } from 'react-router-dom';
import { formatMoney } from '@hitchbook/shared/money';
import type { InvoiceSummaryDto } from '@hitchbook/shared/schemas/invoices';
import { EmptyState } from '../../../components/EmptyState';
import { PageHeader } from '../../../components/PageHeader';
import { ServerTable } from '../../../components/ServerTable';
import { useSessionUserOrThrow } from '../../../lib/auth';
import { useListParams } from '../../../lib/listParams';
import { paths } from '../../../lib/paths';
import { useMyInvoices } from '../api/listMyInvoices';
import { StateBadge } from '../components/StateBadge';
import { formatDay } from '../labels';

const money = { mantineTableHeadCellProps: { align: 'right' as const }, mantineTableBodyCellProps: { align: 'right' as const } };

const columns: MRT_ColumnDef<InvoiceSummaryDto>[] = [
  {
    id: 'number',
    header: 'Invoice',
    accessorFn: (i) => i.numberLabel,
    Cell: ({ row }) => (
      <Anchor component={Link} to={paths.myInvoice(row.original.id)} fw={700} style={{ whiteSpace: 'nowrap' }}>
        {row.original.numberLabel}
      </Anchor>
    ),
  },
  { id: 'issueDate', header: 'Date', accessorFn: (i) => i.issueDate, Cell: ({ row }) => (row.original.issueDate ? formatDay(row.original.issueDate) : '—') },
  { id: 'total', header: 'Total', accessorFn: (i) => i.total, Cell: ({ row }) => formatMoney(row.original.total), ...money },
  {
    accessorKey: 'balance',
    header: 'To pay',
    enableSorting: false,
    Cell: ({ row }) => (
      <Text size="sm" fw={700} c={row.original.state === 'overdue' ? 'red.8' : undefined}>
        {formatMoney(row.original.balance)}
      </Text>
    ),
    ...money,
  },
  { accessorKey: 'state', header: 'State', enableSorting: false, Cell: ({ row }) => <StateBadge state={row.original.state} kind={row.original.kind} size="md" /> },
];

/** On a phone: the invoice with its state and date, and what is left to pay. */
const phoneColumns: MRT_ColumnDef<InvoiceSummaryDto>[] = [
  {
    id: 'number',
    header: 'Invoice',
    size: 130,
    accessorFn: (i) => i.numberLabel,
    Cell: ({ row }) => (
      <Stack gap={4} align="flex-start">
        <Anchor component={Link} to={paths.myInvoice(row.original.id)} fw={700} style={{ whiteSpace: 'nowrap' }}>
          {row.original.numberLabel}
        </Anchor>
        <Text size="xs" c="dimmed">
          {row.original.issueDate ? formatDay(row.original.issueDate) : ''}
        </Text>
        <StateBadge state={row.original.state} kind={row.original.kind} size="md" />
      </Stack>
    ),
  },
  { id: 'total', header: 'Total', size: 100, accessorFn: (i) => i.total, Cell: ({ row }) => formatMoney(row.original.total), ...money },
  {
    accessorKey: 'balance',
    header: 'To pay',
    enableSorting: false,
    size: 100,
    Cell: ({ row }) => (
      <Text size="sm" fw={700} c={row.original.state === 'overdue' ? 'red.8' : undefined}>
        {formatMoney(row.original.balance)}
      </Text>
    ),
    ...money,
  },
];

export function Component() {
  const user = useSessionUserOrThrow();
  const { params, update } = useListParams({ sort: '-issueDate' });
  const invoices = useMyInvoices({ page: params.page, pageSize: params.pageSize, sort: params.sort });
  const phone = useMediaQuery('(max-width: 48em)');
  return (
    <>
      <PageHeader title="My invoices" description={`Invoices from ${user.operationName}. Open one to see the work on it, download the PDF or pay by card.`} />
      <ServerTable
        columns={phone ? phoneColumns : columns}
        query={invoices}
        params={params}
        onParamsChange={update}
        getRowId={(i) => i.id}
        emptyState={<EmptyState title="No invoices yet">Invoices sent to you appear here.</EmptyState>}
      />
    </>
  );
}
