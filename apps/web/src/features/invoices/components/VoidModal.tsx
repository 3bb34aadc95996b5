import { Stack, Text, TextInput } from '@mantine/core';
import { invoiceVoidSchema, type InvoiceDto } from '@hitchbook/shared/schemas/invoices';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { useServerForm } from '../../../lib/form';
import { useVoidInvoice } from '../api/voidInvoice';
import { ActionModal } from './ActionModal';
import { FormButtons } from './FormButtons';

function VoidForm({ invoice, onDone }: { invoice: InvoiceDto; onDone: () => void }) {
  const voiding = useVoidInvoice(invoice.id);
  const { form, onSubmit, formError, submitting } = useServerForm({
    schema: invoiceVoidSchema,
    initialValues: { reason: '' },
    toPayload: (values: { reason: string }) => values,
    mutation: voiding,
    onSuccess: onDone,
  });
  return (
    <form onSubmit={onSubmit} noValidate>
      <Stack gap="md">
        <FormErrorAlert message={formError} />
        <Text>
          {invoice.kind === 'credit-note'
            ? `${invoice.numberLabel} keeps its number and stays on record as void; the invoice it corrected owes its amount again.`
            : `${invoice.numberLabel} keeps its number and stays on record as void; nothing is owed on it. Its work entries can be billed again on a new invoice.`}
        </Text>
        <TextInput label="Reason" placeholder="Billed to the wrong neighbour" autoFocus {...form.getInputProps('reason')} />
        <FormButtons submitLabel={invoice.kind === 'credit-note' ? 'Void credit note' : 'Void invoice'} color="red" submitting={submitting} onCancel={onDone} />
      </Stack>
    </form>
  );
}

export function VoidModal({ invoice, opened, onClose }: { invoice: InvoiceDto; opened: boolean; onClose: () => void }) {
  return (
    <ActionModal opened={opened} onClose={onClose} title={`Void ${invoice.numberLabel}?`}>
      <VoidForm invoice={invoice} onDone={onClose} />
    </ActionModal>
  );
}
