import { Decimal } from 'decimal.js';
import { Group, Paper, Stack, Text, Title } from '@mantine/core';
import { formatMoney } from '@hitchbook/shared/money';
import type { InvoiceLineDto } from '@hitchbook/shared/schemas/invoices';
import { formatDecimal } from '../../../lib/money';
import { formatDay } from '../labels';

const EXTRA_CHARGES: Record<InvoiceLineDto['kind'], string | null> = {
  work: null,
  minimum: 'Minimum charge',
  travel: 'Travel',
  'fuel-adjustment': 'Fuel adjustment',
  labour: 'Operator labour',
  adjustment: null,
  discount: 'Discount',
};

const trimmed = (value: string) => formatDecimal(value, new Decimal(value).decimalPlaces());
const rateText = (rate: string) => `$${formatDecimal(rate, Math.max(2, new Decimal(rate).decimalPlaces()))}`;

/** The invoice's lines as a list that reads the same on a phone as on a desk. */
export function ChargesList({ lines, title }: { lines: InvoiceLineDto[]; title: string }) {
  return (
    <Paper withBorder p="md">
      <Title order={2} size="h4" mb="xs">
        {title}
      </Title>
      <Stack gap={0}>
        {lines.map((line) => {
          const what = EXTRA_CHARGES[line.kind] ?? line.workTypeName ?? line.description;
          const where = [line.workDate ? formatDay(line.workDate) : null, line.fieldName].filter(Boolean).join(' · ');
          return (
            <Group key={line.id} justify="space-between" align="flex-start" wrap="nowrap" py="sm" style={{ borderBottom: '1px solid var(--mantine-color-slate-2)' }}>
              <Stack gap={2} miw={0}>
                <Text fw={600}>{what}</Text>
                {line.description !== what && (
                  <Text size="sm" c="dimmed">
                    {line.description}
                  </Text>
                )}
                {where && (
                  <Text size="sm" c="dimmed">
                    {where}
                  </Text>
                )}
                {line.quantity && (
                  <Text size="sm" c="dimmed">
                    {trimmed(line.quantity)} {line.unit}
                    {line.rate ? ` × ${rateText(line.rate)}` : ''}
                  </Text>
                )}
              </Stack>
              <Text fw={700} style={{ whiteSpace: 'nowrap' }}>
                {formatMoney(line.amount)}
              </Text>
            </Group>
          );
        })}
      </Stack>
    </Paper>
  );
}
