import { SegmentedControl, Stack, Text, TextInput } from '@mantine/core';
import { formatMoney } from '@hitchbook/shared/money';
import { creditNoteCreateSchema, type InvoiceDto } from '@hitchbook/shared/schemas/invoices';
import { DecimalInput } from '../../../components/DecimalInput';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { useServerForm } from '../../../lib/form';
import { useCreateCreditNote, type CreditNoteRequest } from '../api/createCreditNote';
import { ActionModal } from './ActionModal';
import { FormButtons } from './FormButtons';

interface CreditValues {
  reason: string;
  scope: 'whole' | 'part';
  description: string;
  amount: string;
}

function toPayload(values: CreditValues): CreditNoteRequest {
  return values.scope === 'whole'
    ? { reason: values.reason }
    : { reason: values.reason, lines: [{ description: values.description, amount: values.amount }] };
}

/** The one credited line is where "more than is left to credit" belongs. */
function issuePath(path: string): string {
  if (path === 'lines' || path === 'lines.0.amount' || path === 'lines.0') return 'amount';
  return path === 'lines.0.description' ? 'description' : path;
}

function CreditNoteForm({ invoice, onDone, onCancel }: { invoice: InvoiceDto; onDone: (note: InvoiceDto) => void; onCancel: () => void }) {
  const credit = useCreateCreditNote(invoice.id);
  const nothingCreditedYet = invoice.amountCredited === '0.00';
  const { form, onSubmit, formError, submitting } = useServerForm({
    schema: creditNoteCreateSchema,
    initialValues: { reason: '', scope: nothingCreditedYet ? 'whole' : 'part', description: '', amount: '' } as CreditValues,
    toPayload,
    mutation: credit,
    issuePath,
    onSuccess: onDone,
  });
  const scope = form.getValues().scope;
  return (
    <form onSubmit={onSubmit} noValidate>
      <Stack gap="md">
        <FormErrorAlert message={formError} />
        <Text>
          A credit note is a numbered document of its own that refers to {invoice.numberLabel} and lowers its balance.
          {' '}The invoice itself never changes.
        </Text>
        {nothingCreditedYet && (
          <SegmentedControl
            aria-label="Credit"
            data={[
              { value: 'whole', label: `The whole invoice (${formatMoney(invoice.total)})` },
              { value: 'part', label: 'An amount' },
            ]}
            {...form.getInputProps('scope')}
          />
        )}
        <TextInput label="Reason" placeholder="Acres measured again" autoFocus {...form.getInputProps('reason')} />
        {scope === 'part' && (
          <>
            <TextInput label="Line description" placeholder="Set-aside mowing, 3.2 acres less" {...form.getInputProps('description')} />
            <DecimalInput label="Amount to credit" prefix="$" {...form.getInputProps('amount')} />
          </>
        )}
        <FormButtons submitLabel="Issue credit note" submitting={submitting} onCancel={onCancel} />
      </Stack>
    </form>
  );
}

export function CreditNoteModal({ invoice, opened, onClose, onIssued }: { invoice: InvoiceDto; opened: boolean; onClose: () => void; onIssued: (note: InvoiceDto) => void }) {
  return (
    <ActionModal opened={opened} onClose={onClose} title={`Credit note for ${invoice.numberLabel}`}>
      <CreditNoteForm invoice={invoice} onDone={onIssued} onCancel={onClose} />
    </ActionModal>
  );
}
