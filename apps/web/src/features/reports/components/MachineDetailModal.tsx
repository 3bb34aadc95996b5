import { Alert, List, Modal, SimpleGrid, Stack, Table, Text, Title } from '@mantine/core';
import { useMediaQuery } from '@mantine/hooks';
import { Decimal } from 'decimal.js';
import { COST_CATEGORIES } from '@hitchbook/shared/actual-rate';
import { formatMoney } from '@hitchbook/shared/money';
import type { MachineRateRowDto } from '@hitchbook/shared/schemas/reports';
import { formatDecimal } from '../../../lib/money';
import { COST_CATEGORY_LABELS, ESTIMATE_PART_LABELS } from '../../machines/labels';
import { INPUT_SOURCE_LABELS, inputLabel } from '../yearEnd';

const money = (value: string | null | undefined) => (value === null || value === undefined ? '—' : formatMoney(value));

const COMPARED_LABELS = { repairs: 'Repairs', 'fuel-and-lube': 'Fuel and lube', tih: 'Taxes, insurance, housing' } as const;
const ESTIMATE_ROWS = ['capitalRecovery', 'tih', 'repairs', 'fuel', 'lube', 'labor'] as const;

function CostsTable({ row }: { row: MachineRateRowDto }) {
  // Categories with nothing spent would only be rows of zeros.
  const spent = COST_CATEGORIES.filter((c) => !new Decimal(row.costs[c]).isZero());
  if (spent.length === 0) return <Text c="dimmed">No costs logged for the year.</Text>;
  return (
    <Table verticalSpacing={6} data-testid="detail-costs">
      <Table.Thead>
        <Table.Tr>
          <Table.Th>Actual cost</Table.Th>
          <Table.Th ta="right">In the year</Table.Th>
          <Table.Th ta="right">Per hour</Table.Th>
          <Table.Th ta="right">Per acre</Table.Th>
        </Table.Tr>
      </Table.Thead>
      <Table.Tbody>
        {spent.map((c) => (
          <Table.Tr key={c}>
            <Table.Td>{COST_CATEGORY_LABELS[c]}</Table.Td>
            <Table.Td ta="right">{formatMoney(row.costs[c])}</Table.Td>
            <Table.Td ta="right">{money(row.perHour?.[c])}</Table.Td>
            <Table.Td ta="right">{money(row.perAcre?.[c])}</Table.Td>
          </Table.Tr>
        ))}
        <Table.Tr fw={700}>
          <Table.Td>Total</Table.Td>
          <Table.Td ta="right">{formatMoney(row.costs.total)}</Table.Td>
          <Table.Td ta="right">{money(row.perHour?.total)}</Table.Td>
          <Table.Td ta="right">{money(row.perAcre?.total)}</Table.Td>
        </Table.Tr>
      </Table.Tbody>
    </Table>
  );
}

function EstimateTable({ row }: { row: MachineRateRowDto }) {
  if (!row.estimate.available) return <Alert color="slate" variant="light" title="No estimate">{row.estimate.reason}</Alert>;
  const { perHour, perYear } = row.estimate;
  return (
    <Table verticalSpacing={6} data-testid="detail-estimate">
      <Table.Thead>
        <Table.Tr>
          <Table.Th>Estimate</Table.Th>
          <Table.Th ta="right">Per year</Table.Th>
          <Table.Th ta="right">Per hour</Table.Th>
        </Table.Tr>
      </Table.Thead>
      <Table.Tbody>
        {ESTIMATE_ROWS.map((key) => (
          <Table.Tr key={key}>
            <Table.Td>{ESTIMATE_PART_LABELS[key]}</Table.Td>
            <Table.Td ta="right">{formatMoney(perYear[key])}</Table.Td>
            <Table.Td ta="right">{formatMoney(perHour[key])}</Table.Td>
          </Table.Tr>
        ))}
        <Table.Tr fw={700}>
          <Table.Td>{ESTIMATE_PART_LABELS.total}</Table.Td>
          <Table.Td ta="right">{formatMoney(perYear.total)}</Table.Td>
          <Table.Td ta="right">{formatMoney(perHour.total)}</Table.Td>
        </Table.Tr>
      </Table.Tbody>
    </Table>
  );
}

function ComparisonTable({ row }: { row: MachineRateRowDto }) {
  if (!row.comparison) return null;
  return (
    <Table verticalSpacing={6} data-testid="detail-comparison">
      <Table.Thead>
        <Table.Tr>
          <Table.Th>Per hour</Table.Th>
          <Table.Th ta="right">Actual</Table.Th>
          <Table.Th ta="right">Estimate</Table.Th>
          <Table.Th ta="right">Difference</Table.Th>
        </Table.Tr>
      </Table.Thead>
      <Table.Tbody>
        {row.comparison.map((c) => (
          <Table.Tr key={c.item}>
            <Table.Td>{COMPARED_LABELS[c.item]}</Table.Td>
            <Table.Td ta="right">{formatMoney(c.actualPerHour)}</Table.Td>
            <Table.Td ta="right">{formatMoney(c.estimatePerHour)}</Table.Td>
            <Table.Td ta="right">{formatMoney(c.differencePerHour)}</Table.Td>
          </Table.Tr>
        ))}
      </Table.Tbody>
    </Table>
  );
}

function InputsTable({ row }: { row: MachineRateRowDto }) {
  return (
    <Table verticalSpacing={4} data-testid="detail-inputs">
      <Table.Thead>
        <Table.Tr>
          <Table.Th>Estimate input</Table.Th>
          <Table.Th ta="right">Value</Table.Th>
          <Table.Th>From</Table.Th>
        </Table.Tr>
      </Table.Thead>
      <Table.Tbody>
        {row.estimate.inputs.map((input) => (
          <Table.Tr key={input.name}>
            <Table.Td>{inputLabel(input)}</Table.Td>
            <Table.Td ta="right">{input.value}</Table.Td>
            <Table.Td>{INPUT_SOURCE_LABELS[input.source]}</Table.Td>
          </Table.Tr>
        ))}
      </Table.Tbody>
    </Table>
  );
}

function Detail({ row }: { row: MachineRateRowDto }) {
  const { breakEven } = row;
  return (
    <Stack gap="lg">
      <Text c="dimmed">
        {row.classLabel}: {formatDecimal(row.hours, 1)} h and {formatDecimal(row.acres, 1)} acres in the year.
      </Text>
      {row.flags.length > 0 && (
        <Alert color="clay" variant="light" title="Worth a look">
          <List size="sm">
            {row.flags.map((f) => (
              <List.Item key={f.code}>{f.message}</List.Item>
            ))}
          </List>
        </Alert>
      )}
      <SimpleGrid cols={{ base: 1, md: 2 }} spacing="lg">
        <CostsTable row={row} />
        <EstimateTable row={row} />
      </SimpleGrid>
      <ComparisonTable row={row} />
      <Stack gap={4}>
        <Title order={3} size="h5">
          Own or hire
        </Title>
        {breakEven.acres === null ? (
          <Text size="sm">{breakEven.reason}</Text>
        ) : (
          <Text size="sm">
            Owning beats hiring above <b>{formatDecimal(breakEven.acres, 0)} acres</b> a year: {money(breakEven.annualFixedCost)} of
            yearly ownership cost against a custom rate of {money(breakEven.customRatePerAcre)}/acre less{' '}
            {money(breakEven.variableCostPerAcre)}/acre of own operating cost.
          </Text>
        )}
      </Stack>
      <InputsTable row={row} />
    </Stack>
  );
}

export function MachineDetailModal({ row, year, onClose }: { row: MachineRateRowDto | null; year: number; onClose: () => void }) {
  const phone = useMediaQuery('(max-width: 48em)');
  return (
    <Modal opened={row !== null} onClose={onClose} title={row ? `${row.name}, ${year}` : ''} size="xl" fullScreen={phone} data-testid="machine-detail">
      {row && <Detail row={row} />}
    </Modal>
  );
}
