import { Alert, Anchor, Group, Stack, Text } from '@mantine/core';
import { IconAlertTriangle, IconBan, IconInfoCircle, IconReceiptRefund } from '@tabler/icons-react';
import { Link } from 'react-router-dom';
import { formatMoney } from '@hitchbook/shared/money';
import type { InvoiceDto } from '@hitchbook/shared/schemas/invoices';
import { paths } from '../../../lib/paths';
import { formatDay } from '../labels';

/** What a reader must know before the lines: a draft's standing, an overdue balance, a void, a correction. */
export function InvoiceNotices({ invoice }: { invoice: InvoiceDto }) {
  const any =
    invoice.status === 'draft' || invoice.state === 'overdue' || invoice.status === 'void' || invoice.creditOf !== null || invoice.creditNotes.length > 0;
  if (!any) return null;
  return (
    <Stack gap="sm">
      {invoice.status === 'draft' && (
        <Alert color="harbor" variant="light" icon={<IconInfoCircle />} title="Draft">
          Nothing is numbered or sent until you issue it. Each line was priced by the server with the rate sheet in force
          on the day of the work.
        </Alert>
      )}
      {invoice.state === 'overdue' && invoice.dueDate && (
        <Alert color="red" icon={<IconAlertTriangle />} title="Overdue" data-testid="overdue-notice">
          Due on {formatDay(invoice.dueDate)}; {formatMoney(invoice.balance)} is still owed.
        </Alert>
      )}
      {invoice.status === 'void' && (
        <Alert color="slate" icon={<IconBan />} title="Void">
          Voided{invoice.voidedAt ? ` on ${formatDay(invoice.voidedAt)}` : ''}: {invoice.voidReason}. Nothing is owed on it.
        </Alert>
      )}
      {invoice.creditOf && (
        <Alert color="clay" variant="light" icon={<IconReceiptRefund />}>
          Corrects invoice{' '}
          <Anchor component={Link} to={paths.invoice(invoice.creditOf.id)} fw={700}>
            {invoice.creditOf.numberLabel}
          </Anchor>
          {invoice.notes ? `: ${invoice.notes}` : ''}
        </Alert>
      )}
      {invoice.creditNotes.length > 0 && (
        <Alert color="clay" variant="light" icon={<IconReceiptRefund />} title="Corrected by credit notes">
          <Group gap="md">
            {invoice.creditNotes.map((note) => (
              <Text key={note.id} size="sm">
                <Anchor component={Link} to={paths.invoice(note.id)} fw={700}>
                  {note.numberLabel}
                </Anchor>{' '}
                {formatMoney(note.total)}
                {note.status === 'void' ? ' (void)' : ''}
              </Text>
            ))}
          </Group>
        </Alert>
      )}
    </Stack>
  );
}
