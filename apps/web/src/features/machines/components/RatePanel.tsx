import { lazy, Suspense } from 'react';
import { Decimal } from 'decimal.js';
import { Alert, Paper, SimpleGrid, Skeleton, Stack, Table, Text, Title } from '@mantine/core';
import { IconInfoCircle } from '@tabler/icons-react';
import { COST_CATEGORIES } from '@hitchbook/shared/actual-rate';
import { formatMoney } from '@hitchbook/shared/money';
import type { MachineSummaryDto } from '@hitchbook/shared/schemas/machines';
import { formatDecimal } from '../../../lib/money';
import { COST_CATEGORY_LABELS, ESTIMATE_PART_LABELS } from '../labels';
import type { RateBar } from './RateChart';

const RateChart = lazy(() => import('./RateChart'));

const ESTIMATE_ROWS = ['capitalRecovery', 'tih', 'repairs', 'fuel', 'lube', 'labor'] as const;

const money = (value: string | null | undefined) => (value === null || value === undefined ? '—' : formatMoney(value));

function EstimatedTable({ rate }: { rate: Extract<NonNullable<MachineSummaryDto['estimatedRate']>, { available: true }> }) {
  return (
    <Table verticalSpacing={6} data-testid="estimated-rate">
      <Table.Thead>
        <Table.Tr>
          <Table.Th>Estimated</Table.Th>
          <Table.Th ta="right">Per hour</Table.Th>
          <Table.Th ta="right">Per year</Table.Th>
        </Table.Tr>
      </Table.Thead>
      <Table.Tbody>
        {ESTIMATE_ROWS.map((key) => (
          <Table.Tr key={key}>
            <Table.Td>{ESTIMATE_PART_LABELS[key]}</Table.Td>
            <Table.Td ta="right">{formatMoney(rate.perHour[key])}</Table.Td>
            <Table.Td ta="right">{formatMoney(rate.perYear[key])}</Table.Td>
          </Table.Tr>
        ))}
        <Table.Tr fw={700}>
          <Table.Td>{ESTIMATE_PART_LABELS.total}</Table.Td>
          <Table.Td ta="right">{formatMoney(rate.perHour.total)}</Table.Td>
          <Table.Td ta="right">{formatMoney(rate.perYear.total)}</Table.Td>
        </Table.Tr>
      </Table.Tbody>
    </Table>
  );
}

function ActualTable({ actual }: { actual: NonNullable<MachineSummaryDto['actualRate']> }) {
  // Categories with nothing spent in the year would only be rows of zeros.
  const spent = COST_CATEGORIES.filter((c) => !new Decimal(actual.perYear[c]).isZero());
  return (
    <Table verticalSpacing={6} data-testid="actual-rate">
      <Table.Thead>
        <Table.Tr>
          <Table.Th>Actual</Table.Th>
          <Table.Th ta="right">Per hour</Table.Th>
          <Table.Th ta="right">Per acre</Table.Th>
          <Table.Th ta="right">In the year</Table.Th>
        </Table.Tr>
      </Table.Thead>
      <Table.Tbody>
        {spent.map((c) => (
          <Table.Tr key={c}>
            <Table.Td>{COST_CATEGORY_LABELS[c]}</Table.Td>
            <Table.Td ta="right">{money(actual.perHour?.[c])}</Table.Td>
            <Table.Td ta="right">{money(actual.perAcre?.[c])}</Table.Td>
            <Table.Td ta="right">{formatMoney(actual.perYear[c])}</Table.Td>
          </Table.Tr>
        ))}
        <Table.Tr fw={700}>
          <Table.Td>Total</Table.Td>
          <Table.Td ta="right">{money(actual.perHour?.total)}</Table.Td>
          <Table.Td ta="right">{money(actual.perAcre?.total)}</Table.Td>
          <Table.Td ta="right">{formatMoney(actual.perYear.total)}</Table.Td>
        </Table.Tr>
      </Table.Tbody>
    </Table>
  );
}

/** Shown to money roles only: the summary carries no rate for anyone else. */
export function RatePanel({ summary }: { summary: MachineSummaryDto }) {
  const { estimatedRate, actualRate, usage, year } = summary;
  const bars: RateBar[] = [];
  if (estimatedRate?.available) bars.push({ label: 'Estimated', perHour: Number(estimatedRate.perHour.total) });
  if (actualRate?.perHour) bars.push({ label: `Actual ${year}`, perHour: Number(actualRate.perHour.total) });

  return (
    <Paper withBorder p="md" radius="md" data-testid="rate-panel">
      <Stack gap="md">
        <Stack gap={0}>
          <Title order={2} size="h4">
            Rate: estimated and actual
          </Title>
          <Text size="sm" c="dimmed">
            {year}: {formatDecimal(usage.hours, 1)} h ({usage.source === 'meter' ? 'from the meter' : 'from work entries'}),{' '}
            {formatDecimal(usage.acres, 1)} acres
          </Text>
        </Stack>
        <SimpleGrid cols={{ base: 1, md: 2 }} spacing="lg">
          {estimatedRate?.available ? (
            <EstimatedTable rate={estimatedRate} />
          ) : (
            <Alert color="slate" variant="light" title="No estimate">
              {estimatedRate?.reason ?? 'The estimate needs the purchase price.'}
            </Alert>
          )}
          {actualRate && <ActualTable actual={actualRate} />}
        </SimpleGrid>
        {bars.length > 0 && (
          <Suspense fallback={<Skeleton h={200} />}>
            <RateChart bars={bars} />
          </Suspense>
        )}
        <Alert color="slate" variant="light" icon={<IconInfoCircle />} data-testid="estimate-notice">
          {summary.notice}
        </Alert>
      </Stack>
    </Paper>
  );
}
