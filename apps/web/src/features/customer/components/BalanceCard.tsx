import { Button, Divider, Group, Paper, Stack, Text } from '@mantine/core';
import { notifications } from '@mantine/notifications';
import { IconDownload } from '@tabler/icons-react';
import { formatMoney } from '@hitchbook/shared/money';
import type { InvoiceDto } from '@hitchbook/shared/schemas/invoices';
import { useDownloadMyInvoicePdf } from '../api/downloadMyInvoicePdf';
import { canPay } from '../canPay';
import { formatDay } from '../labels';
import { PayButton } from './PayButton';

function Row({ label, value, strong, testId }: { label: string; value: string; strong?: boolean; testId?: string }) {
  return (
    <Group justify="space-between" wrap="nowrap">
      <Text c={strong ? undefined : 'dimmed'} fw={strong ? 700 : undefined}>
        {label}
      </Text>
      <Text fw={700} size={strong ? 'xl' : undefined} data-testid={testId}>
        {value}
      </Text>
    </Group>
  );
}

/** The figures a payer looks for first, with the two things they can do about them. */
export function BalanceCard({ invoice }: { invoice: InvoiceDto }) {
  const pdf = useDownloadMyInvoicePdf();
  return (
    <Paper withBorder p="md" shadow="xs">
      <Stack gap="xs">
        {invoice.kind === 'credit-note' ? (
          // A credit note is money off another invoice: there is nothing to pay on it.
          <Row label="Credit" value={formatMoney(invoice.total)} strong />
        ) : (
          <>
            <Row label="Total" value={formatMoney(invoice.total)} />
            <Row label="Paid" value={formatMoney(invoice.amountPaid)} />
            {invoice.amountCredited !== '0.00' && <Row label="Credited" value={formatMoney(invoice.amountCredited)} />}
            <Divider />
            <Row label="Still to pay" value={formatMoney(invoice.balance)} strong testId="invoice-balance" />
          </>
        )}
        {invoice.dueDate && canPay(invoice) && (
          <Text size="sm" c={invoice.state === 'overdue' ? 'red.8' : 'dimmed'} fw={invoice.state === 'overdue' ? 700 : undefined}>
            {invoice.state === 'overdue' ? 'Was due' : 'Due'} {formatDay(invoice.dueDate)}
          </Text>
        )}
        {canPay(invoice) && <PayButton invoice={invoice} />}
        <Button
          variant="default"
          leftSection={<IconDownload size={18} />}
          loading={pdf.isPending}
          onClick={() => pdf.mutate(invoice, { onError: (error) => notifications.show({ color: 'red', title: 'The PDF could not be downloaded', message: error.message }) })}
        >
          Download PDF
        </Button>
      </Stack>
    </Paper>
  );
}
