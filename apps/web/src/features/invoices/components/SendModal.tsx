import { Stack, Text, TextInput } from '@mantine/core';
import { notifications } from '@mantine/notifications';
import { invoiceSendSchema, type InvoiceDto } from '@hitchbook/shared/schemas/invoices';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { useServerForm } from '../../../lib/form';
import { useSendInvoice } from '../api/sendInvoice';
import { formatDay } from '../labels';
import { ActionModal } from './ActionModal';
import { FormButtons } from './FormButtons';

function SendForm({ invoice, onDone }: { invoice: InvoiceDto; onDone: () => void }) {
  const send = useSendInvoice(invoice.id);
  const { form, onSubmit, formError, submitting } = useServerForm({
    schema: invoiceSendSchema,
    initialValues: { to: invoice.party.email ?? '' },
    toPayload: (values: { to: string }) => (values.to.trim() ? { to: values.to.trim() } : {}),
    mutation: send,
    onSuccess: (result) => {
      notifications.show({ color: 'harbor', title: `${invoice.numberLabel} is on its way`, message: `E-mailed to ${result.to} with the PDF${invoice.payUrl ? ' and a link to pay by card' : ''}.` });
      onDone();
    },
  });
  return (
    <form onSubmit={onSubmit} noValidate>
      <Stack gap="md">
        <FormErrorAlert message={formError} />
        <Text>
          The e-mail carries the invoice as a PDF{invoice.kind === 'invoice' ? ' and a link where the customer signs in to see the work and pay by card' : ''}.
          {invoice.sentAt ? ` It was last sent on ${formatDay(invoice.sentAt)}.` : ''}
        </Text>
        <TextInput label="Send to" type="email" inputMode="email" description="The customer's address on file unless you give another." {...form.getInputProps('to')} />
        <FormButtons submitLabel="Send e-mail" submitting={submitting} onCancel={onDone} />
      </Stack>
    </form>
  );
}

export function SendModal({ invoice, opened, onClose }: { invoice: InvoiceDto; opened: boolean; onClose: () => void }) {
  return (
    <ActionModal opened={opened} onClose={onClose} title={`E-mail ${invoice.numberLabel}`}>
      <SendForm invoice={invoice} onDone={onClose} />
    </ActionModal>
  );
}
