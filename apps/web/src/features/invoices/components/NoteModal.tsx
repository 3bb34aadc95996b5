import { Stack, Text, TextInput, Textarea } from '@mantine/core';
import { invoiceDraftUpdateSchema, type InvoiceDraftUpdateInput, type InvoiceDto } from '@hitchbook/shared/schemas/invoices';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { useServerForm } from '../../../lib/form';
import { useDraftChange } from '../api/updateDraft';
import { ActionModal } from './ActionModal';
import { FormButtons } from './FormButtons';

interface NoteValues {
  notes: string;
  termsDays: string;
}

function NoteForm({ invoice, onDone }: { invoice: InvoiceDto; onDone: () => void }) {
  const change = useDraftChange(invoice.id, (update: InvoiceDraftUpdateInput) => update);
  const { form, onSubmit, formError, submitting } = useServerForm({
    schema: invoiceDraftUpdateSchema,
    initialValues: { notes: invoice.notes ?? '', termsDays: String(invoice.termsDays) },
    toPayload: (values: NoteValues): InvoiceDraftUpdateInput => ({
      version: invoice.version,
      notes: values.notes.trim() ? values.notes : null,
      // A count of days, not money; a blank becomes NaN so the schema asks for a whole number.
      termsDays: values.termsDays.trim() === '' ? Number.NaN : Number(values.termsDays),
    }),
    mutation: change,
    onSuccess: onDone,
  });
  return (
    <form onSubmit={onSubmit} noValidate>
      <Stack gap="md">
        <FormErrorAlert message={formError} />
        <Textarea label="Note on the invoice" description="Printed on the invoice and shown to the customer." autosize minRows={3} autoFocus {...form.getInputProps('notes')} />
        <TextInput label="Payment due" inputMode="numeric" rightSection={<Text c="dimmed" size="sm">days</Text>} rightSectionWidth={52} description="After the issue date." {...form.getInputProps('termsDays')} />
        <FormButtons submitLabel="Save" submitting={submitting} onCancel={onDone} />
      </Stack>
    </form>
  );
}

export function NoteModal({ invoice, opened, onClose }: { invoice: InvoiceDto; opened: boolean; onClose: () => void }) {
  return (
    <ActionModal opened={opened} onClose={onClose} title="Note and terms">
      <NoteForm invoice={invoice} onDone={onClose} />
    </ActionModal>
  );
}
