import { Group, Paper, Stack, Text, Title } from '@mantine/core';
import { formatMoney } from '@hitchbook/shared/money';
import { useMyPayments } from '../api/listMyPayments';
import { formatDay, METHOD_LABELS } from '../labels';

export function MyPayments({ invoiceId }: { invoiceId: string }) {
  const payments = useMyPayments(invoiceId);
  if (!payments.data || payments.data.length === 0) return null;
  return (
    <Paper withBorder p="md" data-testid="payments">
      <Title order={2} size="h4" mb="xs">
        Your payments
      </Title>
      <Stack gap={6}>
        {payments.data.map((p) => (
          <Group key={p.id} justify="space-between">
            <Text>
              {formatDay(p.receivedOn)} · {METHOD_LABELS[p.method]}
              {p.status === 'refunded' ? ' (refunded)' : ''}
            </Text>
            <Text fw={700}>{formatMoney(p.amount)}</Text>
          </Group>
        ))}
      </Stack>
    </Paper>
  );
}
