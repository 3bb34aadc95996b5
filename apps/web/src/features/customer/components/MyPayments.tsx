import { Group, Paper, Stack, Text, Title } from '@mantine/core';
import { Decimal } from 'decimal.js';
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
          <Group key={p.id} justify="space-between" align="flex-start" wrap="nowrap">
            <Text>
              {formatDay(p.receivedOn)} · {METHOD_LABELS[p.method]}
              {p.status === 'refunded' ? ' (refunded)' : ''}
            </Text>
            <Stack gap={0} align="flex-end">
              <Text fw={700}>{formatMoney(p.amount)}</Text>
              {/* Part of a card payment handed back: the payer sees it went to their card. */}
              {new Decimal(p.amountRefunded).gt(0) && p.status !== 'refunded' && (
                <Text size="sm" c="dimmed" ta="right">
                  {formatMoney(p.amountRefunded)} refunded to your card
                </Text>
              )}
            </Stack>
          </Group>
        ))}
      </Stack>
    </Paper>
  );
}
