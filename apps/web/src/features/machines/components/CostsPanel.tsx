import { useState } from 'react';
import { Decimal } from 'decimal.js';
import { ActionIcon, Button, Group, Paper, Select, Stack, Text, TextInput, Title, Tooltip } from '@mantine/core';
import { notifications } from '@mantine/notifications';
import { IconDownload, IconPlus } from '@tabler/icons-react';
import type { MRT_ColumnDef } from 'mantine-react-table';
import { COST_CATEGORIES, type CostCategory } from '@hitchbook/shared/actual-rate';
import { formatMoney } from '@hitchbook/shared/money';
import type { CostEntryDto } from '@hitchbook/shared/schemas/machines';
import { EmptyState } from '../../../components/EmptyState';
import { ServerTable } from '../../../components/ServerTable';
import { TABULAR } from '../tabular';
import { formatDecimal } from '../../../lib/money';
import { exportCostEntries } from '../api/exportCostEntries';
import { useCostEntries } from '../api/listCostEntries';
import { useHouseholds } from '../api/listHouseholds';
import { downloadReceipt } from '../api/uploadReceipt';
import { COST_CATEGORY_LABELS } from '../labels';
import { useSectionParams } from '../sectionParams';
import { CostFormModal } from './CostFormModal';

const DAY = /^\d{4}-\d{2}-\d{2}$/;
const dayOrUndefined = (raw: string | null) => (raw && DAY.test(raw) ? raw : undefined);

async function download(uploadId: string) {
  try {
    await downloadReceipt(uploadId);
  } catch (error) {
    notifications.show({ color: 'red', title: 'The receipt could not be downloaded', message: error instanceof Error ? error.message : '' });
  }
}

const columns: MRT_ColumnDef<CostEntryDto>[] = [
  { accessorKey: 'incurredOn', header: 'Date', size: 120 },
  { accessorKey: 'category', header: 'Category', size: 120, Cell: ({ row }) => COST_CATEGORY_LABELS[row.original.category] },
  { accessorKey: 'amount', header: 'Amount', size: 120, Cell: ({ row }) => <Text size="sm" style={TABULAR}>{formatMoney(row.original.amount)}</Text> },
  {
    accessorKey: 'gallons',
    header: 'Gallons',
    size: 90,
    enableSorting: false,
    Cell: ({ row }) => (row.original.gallons ? formatDecimal(row.original.gallons, 1) : '—'),
  },
  { accessorKey: 'vendor', header: 'Vendor', size: 150, enableSorting: false, Cell: ({ row }) => row.original.vendor ?? '—' },
  { accessorKey: 'paidByName', header: 'Paid by', size: 150, enableSorting: false, Cell: ({ row }) => row.original.paidByName ?? '—' },
  {
    id: 'receipt',
    header: 'Receipt',
    size: 90,
    enableSorting: false,
    Cell: ({ row }) => {
      const uploadId = row.original.receiptUploadId;
      if (!uploadId) return <Text c="dimmed">—</Text>;
      return (
        <Tooltip label="Download the receipt">
          <ActionIcon variant="subtle" size="xl" aria-label={`Download the receipt of ${row.original.incurredOn}`} onClick={() => void download(uploadId)}>
            <IconDownload />
          </ActionIcon>
        </Tooltip>
      );
    },
  },
];

interface CostsPanelProps {
  machineId: string;
  canManage: boolean;
  ownPartyId: string | null;
}

export function CostsPanel({ machineId, canManage, ownPartyId }: CostsPanelProps) {
  const { params, own, update } = useSectionParams('cost', { sort: '-incurredOn', pageSize: 10 });
  const category = COST_CATEGORIES.find((c) => c === own.get('category')) as CostCategory | undefined;
  const from = dayOrUndefined(own.get('from'));
  const to = dayOrUndefined(own.get('to'));
  const paidByPartyId = own.get('paidBy') ?? undefined;
  const costs = useCostEntries(machineId, { page: params.page, pageSize: params.pageSize, sort: params.sort, category, from, to, paidByPartyId });
  const households = useHouseholds();
  const [adding, setAdding] = useState(false);
  const [exporting, setExporting] = useState(false);
  const filtered = Boolean(category || from || to || paidByPartyId);

  async function exportCsv() {
    setExporting(true);
    try {
      await exportCostEntries(machineId, { sort: params.sort, category, from, to, paidByPartyId });
    } catch (error) {
      notifications.show({ color: 'red', title: 'The export did not download', message: error instanceof Error ? error.message : '' });
    } finally {
      setExporting(false);
    }
  }

  const toolbar = (
    <>
      <Select
        aria-label="Category"
        placeholder="Any category"
        clearable
        w={180}
        value={category ?? null}
        onChange={(value) => update({ category: value ?? undefined })}
        data={COST_CATEGORIES.map((c) => ({ value: c, label: COST_CATEGORY_LABELS[c] }))}
      />
      <TextInput aria-label="From" type="date" w={210} leftSection={<Text size="sm" c="dimmed">From</Text>} leftSectionWidth={52} value={from ?? ''} onChange={(e) => update({ from: e.currentTarget.value || undefined })} />
      <TextInput aria-label="To" type="date" w={200} leftSection={<Text size="sm" c="dimmed">To</Text>} leftSectionWidth={36} value={to ?? ''} onChange={(e) => update({ to: e.currentTarget.value || undefined })} />
      <Select
        aria-label="Paid by"
        placeholder="Paid by anyone"
        clearable
        w={230}
        value={paidByPartyId ?? null}
        onChange={(value) => update({ paidBy: value ?? undefined })}
        data={(households.data ?? []).map((h) => ({ value: h.id, label: h.name }))}
      />
    </>
  );

  return (
    <Paper withBorder p="md" radius="md" data-testid="costs-panel">
      <Stack gap="md">
        <Group justify="space-between">
          <Title order={2} size="h4">
            Costs
          </Title>
          <Group gap="sm">
            <Button variant="default" leftSection={<IconDownload size={18} />} loading={exporting} onClick={() => void exportCsv()}>
              Export CSV{filtered ? ' of these costs' : ''}
            </Button>
            {canManage && (
              <Button variant="light" leftSection={<IconPlus size={18} />} onClick={() => setAdding(true)}>
                Add a cost
              </Button>
            )}
          </Group>
        </Group>
        <ServerTable
          columns={columns}
          query={costs}
          params={params}
          onParamsChange={update}
          getRowId={(cost) => cost.id}
          toolbar={toolbar}
          emptyState={<EmptyState title={filtered ? 'No costs match' : 'No costs yet'}>{filtered ? 'Clear a filter to see more.' : undefined}</EmptyState>}
        />
        {costs.data && costs.data.total > 0 && (
          <Text fw={700} ta="right" data-testid="cost-totals">
            {costs.data.total} cost{costs.data.total === 1 ? '' : 's'}: {formatMoney(costs.data.totals.amount)}
            {!new Decimal(costs.data.totals.gallons).isZero() && ` · ${formatDecimal(costs.data.totals.gallons, 1)} gal`}
          </Text>
        )}
      </Stack>
      <CostFormModal opened={adding} machineId={machineId} ownPartyId={ownPartyId} onDone={() => setAdding(false)} />
    </Paper>
  );
}
