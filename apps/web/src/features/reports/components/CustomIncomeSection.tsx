import { lazy, Suspense } from 'react';
import { Paper, SimpleGrid, Skeleton, Stack, Table, Text, Title } from '@mantine/core';
import { formatMoney } from '@hitchbook/shared/money';
import type { CustomIncomeReportDto } from '@hitchbook/shared/schemas/reports';
import { formatDecimal } from '../../../lib/money';

const IncomeChart = lazy(() => import('./IncomeChart'));

const RELATIONSHIP_LABELS = { family: 'Family', neighbour: 'Neighbour', agency: 'Agency' } as const;

function ByCustomer({ report }: { report: CustomIncomeReportDto }) {
  return (
    <Table verticalSpacing={6} data-testid="income-by-customer">
      <Table.Thead>
        <Table.Tr>
          <Table.Th>Customer</Table.Th>
          <Table.Th ta="right">Invoices</Table.Th>
          <Table.Th ta="right">Invoiced</Table.Th>
        </Table.Tr>
      </Table.Thead>
      <Table.Tbody>
        {report.byCustomer.map((c) => (
          <Table.Tr key={c.partyId}>
            <Table.Td>
              {c.name}
              <Text span size="xs" c="dimmed">
                {' '}
                {RELATIONSHIP_LABELS[c.relationship]}
              </Text>
            </Table.Td>
            <Table.Td ta="right">{c.invoices}</Table.Td>
            <Table.Td ta="right">{formatMoney(c.amount)}</Table.Td>
          </Table.Tr>
        ))}
      </Table.Tbody>
      <Table.Tfoot>
        <Table.Tr>
          <Table.Th>Total</Table.Th>
          <Table.Th />
          <Table.Th ta="right">{formatMoney(report.total)}</Table.Th>
        </Table.Tr>
      </Table.Tfoot>
    </Table>
  );
}

function ByWorkType({ report }: { report: CustomIncomeReportDto }) {
  return (
    <Table.ScrollContainer minWidth={420}>
      <Table verticalSpacing={6} data-testid="income-by-work-type">
        <Table.Thead>
          <Table.Tr>
            <Table.Th>Work type</Table.Th>
            <Table.Th ta="right">Quantity</Table.Th>
            <Table.Th ta="right">Lines</Table.Th>
            <Table.Th ta="right">Invoiced</Table.Th>
          </Table.Tr>
        </Table.Thead>
        <Table.Tbody>
          {report.byWorkType.map((w) => (
            <Table.Tr key={`${w.workType}-${w.unit ?? ''}`}>
              <Table.Td>{w.workType}</Table.Td>
              <Table.Td ta="right">{w.quantity === null ? '—' : `${formatDecimal(w.quantity, 1)} ${w.unit ?? ''}`}</Table.Td>
              <Table.Td ta="right">{w.lines}</Table.Td>
              <Table.Td ta="right">{formatMoney(w.amount)}</Table.Td>
            </Table.Tr>
          ))}
        </Table.Tbody>
      </Table>
    </Table.ScrollContainer>
  );
}

/** What custom work brought in, by customer and by work type. */
export function CustomIncomeSection({ report }: { report: CustomIncomeReportDto }) {
  return (
    <Paper withBorder radius="md" p="md" style={{ overflow: 'hidden' }} data-testid="custom-income">
      <Title order={2} size="h4" mb="sm">
        Custom-work income: {formatMoney(report.total)}
      </Title>
      {report.byCustomer.length === 0 ? (
        <Text c="dimmed">No custom work was invoiced in {report.year}.</Text>
      ) : (
        <Stack gap="lg">
          <SimpleGrid cols={{ base: 1, md: 2 }} spacing="lg">
            <ByCustomer report={report} />
            <Suspense fallback={<Skeleton h={200} />}>
              <IncomeChart byCustomer={report.byCustomer} />
            </Suspense>
          </SimpleGrid>
          <ByWorkType report={report} />
        </Stack>
      )}
    </Paper>
  );
}
