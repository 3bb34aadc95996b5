import { Paper, SimpleGrid, Stack, Text, Title } from '@mantine/core';
import type { InvoiceDto, PartySnapshotDto } from '@hitchbook/shared/schemas/invoices';
import { formatDay } from '../labels';

function Party({ title, party }: { title: string; party: PartySnapshotDto }) {
  return (
    <Stack gap={2}>
      <Text size="sm" c="dimmed">
        {title}
      </Text>
      <Text fw={700}>{party.name}</Text>
      {party.address && (
        <Text size="sm" style={{ whiteSpace: 'pre-wrap' }}>
          {party.address}
        </Text>
      )}
      {party.email && <Text size="sm">{party.email}</Text>}
    </Stack>
  );
}

function Dates({ invoice }: { invoice: InvoiceDto }) {
  const rows: Array<[string, string]> = [];
  if (invoice.periodFrom && invoice.periodTo) rows.push(['Work from', `${formatDay(invoice.periodFrom)} to ${formatDay(invoice.periodTo)}`]);
  if (invoice.issueDate) rows.push(['Issued', formatDay(invoice.issueDate)]);
  if (invoice.dueDate) rows.push(['Due', formatDay(invoice.dueDate)]);
  else if (invoice.kind === 'invoice') rows.push(['Terms', `Due ${invoice.termsDays} days after issue`]);
  if (invoice.sentAt) rows.push(['E-mailed', formatDay(invoice.sentAt)]);
  return (
    <Stack gap={4}>
      {rows.map(([label, value]) => (
        <Text key={label} size="sm">
          <Text span c="dimmed">
            {label}:{' '}
          </Text>
          <Text span fw={600} c={label === 'Due' && invoice.state === 'overdue' ? 'red.8' : undefined}>
            {value}
          </Text>
        </Text>
      ))}
    </Stack>
  );
}

export function PartyAndTerms({ invoice }: { invoice: InvoiceDto }) {
  return (
    <Paper withBorder p="md">
      <Title order={2} size="h5" mb="sm" c="dimmed" tt="uppercase">
        {invoice.kind === 'credit-note' ? 'Credit note' : 'Invoice'}
      </Title>
      <SimpleGrid cols={{ base: 1, sm: 3 }} spacing="md">
        <Party title="From" party={invoice.issuer} />
        <Party title="Bill to" party={invoice.party} />
        <Dates invoice={invoice} />
      </SimpleGrid>
    </Paper>
  );
}
