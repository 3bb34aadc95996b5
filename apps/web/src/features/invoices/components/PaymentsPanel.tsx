import { Paper, Skeleton, Table, Text, Title } from '@mantine/core';
import { formatMoney } from '@hitchbook/shared/money';
import { QueryError } from '../../../components/QueryError';
import { usePayments } from '../api/listPayments';
import { formatDay, METHOD_LABELS } from '../labels';

export function PaymentsPanel({ invoiceId }: { invoiceId: string }) {
  const payments = usePayments(invoiceId, true);
  return (
    <Paper withBorder p="md" data-testid="payments">
      <Title order={2} size="h4" mb="sm">
        Payments
      </Title>
      {payments.isError ? (
        <QueryError error={payments.error} onRetry={() => void payments.refetch()} />
      ) : payments.isPending ? (
        <Skeleton h={60} />
      ) : payments.data.length === 0 ? (
        <Text c="dimmed">No payments yet.</Text>
      ) : (
        <Table.ScrollContainer minWidth={420}>
          <Table verticalSpacing="xs">
            <Table.Thead>
              <Table.Tr>
                <Table.Th>Received</Table.Th>
                <Table.Th>How</Table.Th>
                <Table.Th>Reference</Table.Th>
                <Table.Th ta="right">Amount</Table.Th>
              </Table.Tr>
            </Table.Thead>
            <Table.Tbody>
              {payments.data.map((p) => (
                <Table.Tr key={p.id} c={p.status === 'refunded' ? 'dimmed' : undefined}>
                  <Table.Td>{formatDay(p.receivedOn)}</Table.Td>
                  <Table.Td>
                    {METHOD_LABELS[p.method]}
                    {p.status === 'refunded' ? ' (refunded)' : ''}
                  </Table.Td>
                  <Table.Td>{p.reference ?? '—'}</Table.Td>
                  <Table.Td ta="right" fw={700}>
                    {formatMoney(p.amount)}
                  </Table.Td>
                </Table.Tr>
              ))}
            </Table.Tbody>
          </Table>
        </Table.ScrollContainer>
      )}
    </Paper>
  );
}
