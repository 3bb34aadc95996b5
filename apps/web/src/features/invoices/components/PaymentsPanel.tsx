import { useState } from 'react';
import { Alert, Button, Paper, Skeleton, Stack, Table, Text, Title } from '@mantine/core';
import { IconAlertTriangle } from '@tabler/icons-react';
import { Decimal } from 'decimal.js';
import { formatMoney } from '@hitchbook/shared/money';
import type { PaymentDto } from '@hitchbook/shared/schemas/invoices';
import { QueryError } from '../../../components/QueryError';
import { usePayments } from '../api/listPayments';
import { formatDay, METHOD_LABELS } from '../labels';
import { refundableOf, RefundModal } from './RefundModal';

/** Payments received, what went back by refund, and (for the owner) money that should go back. */
export function PaymentsPanel({ invoiceId, canRefund }: { invoiceId: string; canRefund: boolean }) {
  const payments = usePayments(invoiceId, true);
  const [refunding, setRefunding] = useState<PaymentDto | null>(null);
  const due = payments.data?.filter((p) => p.refundDue !== null) ?? [];
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
        <Stack gap="sm">
          {due.map((p) => (
            <Alert key={p.id} color="red" icon={<IconAlertTriangle size={18} />} title={`Refund due on the card payment of ${formatMoney(p.amount)}, ${formatDay(p.receivedOn)}`} data-testid="refund-due">
              {p.refundDue}
            </Alert>
          ))}
          <Table.ScrollContainer minWidth={420}>
            <Table verticalSpacing="xs">
              <Table.Thead>
                <Table.Tr>
                  <Table.Th>Received</Table.Th>
                  <Table.Th>How</Table.Th>
                  <Table.Th>Reference</Table.Th>
                  <Table.Th ta="right">Amount</Table.Th>
                  {canRefund && <Table.Th />}
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
                    <Table.Td ta="right">
                      <Text fw={700} span>
                        {formatMoney(p.amount)}
                      </Text>
                      {new Decimal(p.amountRefunded).gt(0) && (
                        <Text size="sm" c="dimmed">
                          {formatMoney(p.amountRefunded)} refunded
                        </Text>
                      )}
                    </Table.Td>
                    {canRefund && (
                      <Table.Td ta="right">
                        {refundableOf(p) && (
                          <Button size="xs" variant={p.refundDue ? 'filled' : 'default'} color={p.refundDue ? 'red' : undefined} onClick={() => setRefunding(p)}>
                            Refund
                          </Button>
                        )}
                      </Table.Td>
                    )}
                  </Table.Tr>
                ))}
              </Table.Tbody>
            </Table>
          </Table.ScrollContainer>
        </Stack>
      )}
      {canRefund && <RefundModal invoiceId={invoiceId} payment={refunding} onClose={() => setRefunding(null)} />}
    </Paper>
  );
}
