import { Alert, Grid, Group, Skeleton, Stack, Text } from '@mantine/core';
import { IconAlertTriangle, IconBan, IconReceiptRefund } from '@tabler/icons-react';
import { useParams } from 'react-router-dom';
import type { InvoiceDto } from '@hitchbook/shared/schemas/invoices';
import { NotFound } from '../../../components/NotFound';
import { PageHeader } from '../../../components/PageHeader';
import { QueryError } from '../../../components/QueryError';
import { isApiError } from '../../../lib/api';
import { useMyInvoice } from '../api/getMyInvoice';
import { BalanceCard } from '../components/BalanceCard';
import { ChargesList } from '../components/ChargesList';
import { MyPayments } from '../components/MyPayments';
import { StateBadge } from '../components/StateBadge';
import { WorkEntriesTable } from '../components/WorkEntriesTable';
import { formatDay } from '../labels';

function Notices({ invoice }: { invoice: InvoiceDto }) {
  return (
    <>
      {invoice.state === 'overdue' && invoice.dueDate && (
        <Alert color="red" icon={<IconAlertTriangle />} title="Overdue">
          This invoice was due on {formatDay(invoice.dueDate)}.
        </Alert>
      )}
      {invoice.status === 'void' && (
        <Alert color="slate" icon={<IconBan />} title="Void">
          This invoice was withdrawn; nothing is owed on it.
        </Alert>
      )}
      {invoice.kind === 'credit-note' && invoice.creditOf && (
        <Alert color="clay" variant="light" icon={<IconReceiptRefund />}>
          A credit against invoice {invoice.creditOf.numberLabel}
          {invoice.notes ? `: ${invoice.notes}` : ''}.
        </Alert>
      )}
    </>
  );
}

export function MyInvoiceView({ invoice }: { invoice: InvoiceDto }) {
  return (
    <Stack gap="lg">
      <PageHeader
        title={`${invoice.kind === 'credit-note' ? 'Credit note' : 'Invoice'} ${invoice.numberLabel}`}
        description={
          <Group gap="xs" component="span">
            <StateBadge state={invoice.state} kind={invoice.kind} />
            <span>
              From {invoice.issuer.name}
              {invoice.issueDate ? `, ${formatDay(invoice.issueDate)}` : ''}
            </span>
          </Group>
        }
      />
      <Notices invoice={invoice} />
      <Grid gutter="lg">
        <Grid.Col span={{ base: 12, md: 4 }} order={{ base: 1, md: 2 }}>
          <Stack gap="lg">
            <BalanceCard invoice={invoice} />
            <MyPayments invoiceId={invoice.id} />
          </Stack>
        </Grid.Col>
        <Grid.Col span={{ base: 12, md: 8 }} order={{ base: 2, md: 1 }}>
          <Stack gap="lg">
            <WorkEntriesTable entries={invoice.entries ?? []} />
            <ChargesList lines={invoice.lines} title={invoice.kind === 'credit-note' ? 'What is credited' : 'What you are billed for'} />
            {invoice.notes && invoice.kind === 'invoice' && (
              <Text size="sm" style={{ whiteSpace: 'pre-wrap' }}>
                {invoice.notes}
              </Text>
            )}
          </Stack>
        </Grid.Col>
      </Grid>
    </Stack>
  );
}

export function Component() {
  const { invoiceId = '' } = useParams();
  const invoice = useMyInvoice(invoiceId);
  if (invoice.isError && isApiError(invoice.error) && (invoice.error.status === 404 || invoice.error.status === 400)) return <NotFound />;
  if (invoice.isError) return <QueryError error={invoice.error} onRetry={() => void invoice.refetch()} />;
  if (invoice.isPending) return <Skeleton h={420} />;
  return <MyInvoiceView invoice={invoice.data} />;
}
