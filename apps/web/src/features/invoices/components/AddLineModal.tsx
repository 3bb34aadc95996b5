import { SimpleGrid, Stack, Text, TextInput } from '@mantine/core';
import { extraLineSchema, type InvoiceDto } from '@hitchbook/shared/schemas/invoices';
import { DecimalInput } from '../../../components/DecimalInput';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { useServerForm } from '../../../lib/form';
import { useDraftChange } from '../api/updateDraft';
import { extraLinesWith, type ExtraLineInput } from '../draftEdits';
import { ActionModal } from './ActionModal';
import { FormButtons } from './FormButtons';

/** The server answers for the whole list of added lines; the new one is the field to show it on. */
function issuePath(path: string): string {
  const field = /^extraLines\.\d+\.(\w+)$/.exec(path);
  return field?.[1] ?? path;
}

function AddLineForm({ invoice, onDone }: { invoice: InvoiceDto; onDone: () => void }) {
  const change = useDraftChange(invoice.id, (line: ExtraLineInput) => ({ version: invoice.version, extraLines: extraLinesWith(invoice, line) }));
  const { form, onSubmit, formError, submitting } = useServerForm({
    schema: extraLineSchema,
    initialValues: { description: '', quantity: '1', unit: '', rate: '' },
    toPayload: (values: ExtraLineInput) => values,
    mutation: change,
    issuePath,
    onSuccess: onDone,
  });
  return (
    <form onSubmit={onSubmit} noValidate>
      <Stack gap="md">
        <FormErrorAlert message={formError} />
        <TextInput label="Description" placeholder="Hauled bales to the barn" autoFocus {...form.getInputProps('description')} />
        <SimpleGrid cols={{ base: 1, xs: 3 }} spacing="md">
          <DecimalInput label="Quantity" {...form.getInputProps('quantity')} />
          <TextInput label="Unit" placeholder="load" {...form.getInputProps('unit')} />
          <DecimalInput label="Rate" prefix="$" {...form.getInputProps('rate')} />
        </SimpleGrid>
        <Text size="sm" c="dimmed">
          The server works out the amount (quantity × rate, to the cent) and the new total.
        </Text>
        <FormButtons submitLabel="Add line" submitting={submitting} onCancel={onDone} />
      </Stack>
    </form>
  );
}

export function AddLineModal({ invoice, opened, onClose }: { invoice: InvoiceDto; opened: boolean; onClose: () => void }) {
  return (
    <ActionModal opened={opened} onClose={onClose} title="Add a line">
      <AddLineForm invoice={invoice} onDone={onClose} />
    </ActionModal>
  );
}
