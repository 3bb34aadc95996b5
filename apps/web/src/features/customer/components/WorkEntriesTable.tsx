import { Decimal } from 'decimal.js';
import { Group, Paper, Stack, Text, Title } from '@mantine/core';
import type { InvoiceEntryDto } from '@hitchbook/shared/schemas/invoices';
import { formatDecimal } from '../../../lib/money';
import { formatDay } from '../labels';

const trimmed = (value: string) => formatDecimal(value, new Decimal(value).decimalPlaces());

/** What was done on the customer's ground, in the measures the work was logged in. */
function quantitiesOf(entry: InvoiceEntryDto): string {
  const measures = [
    entry.acres && `${trimmed(entry.acres)} acres`,
    entry.miles && `${trimmed(entry.miles)} miles`,
    entry.loads && `${trimmed(entry.loads)} loads`,
    entry.eachCount && `${trimmed(entry.eachCount)} each`,
    `${trimmed(entry.hours)} h`,
  ];
  return measures.filter(Boolean).join(' · ');
}

/** One row per work entry on the invoice, as a list that needs no sideways scrolling on a phone. */
export function WorkEntriesTable({ entries }: { entries: InvoiceEntryDto[] }) {
  if (entries.length === 0) return null;
  return (
    <Paper withBorder p="md" data-testid="work-entries">
      <Title order={2} size="h4" mb="xs">
        Work done
      </Title>
      <Stack gap={0}>
        {entries.map((entry) => (
          <Group key={entry.id} justify="space-between" align="flex-start" gap="sm" wrap="nowrap" py="sm" style={{ borderBottom: '1px solid var(--mantine-color-slate-2)' }}>
            <Stack gap={2} miw={0}>
              <Text fw={600}>{entry.workTypeName}</Text>
              <Text size="sm" c="dimmed">
                {formatDay(entry.workDate)} · {entry.fieldName}
              </Text>
            </Stack>
            <Text size="sm" fw={600} ta="right" style={{ whiteSpace: 'nowrap' }}>
              {quantitiesOf(entry)}
            </Text>
          </Group>
        ))}
      </Stack>
    </Paper>
  );
}
