import { Divider, Group, Paper, Stack, Text } from '@mantine/core';
import { formatMoney } from '@hitchbook/shared/money';
import type { InvoiceDto } from '@hitchbook/shared/schemas/invoices';
import { currentDiscount } from '../draftEdits';

function Row({ label, value, strong, testId }: { label: string; value: string; strong?: boolean; testId?: string }) {
  return (
    <Group justify="space-between" gap="lg" wrap="nowrap">
      <Text c={strong ? undefined : 'dimmed'} fw={strong ? 700 : undefined}>
        {label}
      </Text>
      <Text fw={700} size={strong ? 'lg' : undefined} data-testid={testId} style={{ whiteSpace: 'nowrap' }}>
        {value}
      </Text>
    </Group>
  );
}

/** Totals exactly as the server worked them out; nothing is added up in the browser. */
export function InvoiceTotals({ invoice }: { invoice: InvoiceDto }) {
  const discount = currentDiscount(invoice);
  const issued = invoice.status !== 'draft';
  const isInvoice = invoice.kind === 'invoice';
  return (
    <Paper withBorder p="md" miw={280}>
      <Stack gap="xs">
        {discount && <Row label="Subtotal" value={formatMoney(invoice.subtotal)} />}
        {discount && <Row label={`Discount: ${discount.description}`} value={formatMoney(discount.amount)} />}
        <Row label="Total" value={formatMoney(invoice.total)} strong testId="invoice-total" />
        {issued && isInvoice && (
          <>
            <Divider />
            <Row label="Paid" value={formatMoney(invoice.amountPaid)} />
            {invoice.amountCredited !== '0.00' && <Row label="Credited" value={formatMoney(invoice.amountCredited)} />}
            <Row label="Balance" value={formatMoney(invoice.balance)} strong testId="invoice-balance" />
          </>
        )}
      </Stack>
    </Paper>
  );
}
