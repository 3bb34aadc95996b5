import { Button, SegmentedControl, Stack, Text, TextInput } from '@mantine/core';
import { discountSchema, type InvoiceDto } from '@hitchbook/shared/schemas/invoices';
import { formatMoney } from '@hitchbook/shared/money';
import { DecimalInput } from '../../../components/DecimalInput';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { useServerForm } from '../../../lib/form';
import { useDraftChange } from '../api/updateDraft';
import { currentDiscount } from '../draftEdits';
import { ActionModal } from './ActionModal';
import { FormButtons } from './FormButtons';

interface DiscountValues {
  kind: 'amount' | 'percent';
  description: string;
  amount: string;
  percent: string;
}

type DiscountPayload = { kind: 'amount'; description: string; amount: string } | { kind: 'percent'; description: string; percent: string };

function toPayload(values: DiscountValues): DiscountPayload {
  return values.kind === 'amount'
    ? { kind: 'amount', description: values.description, amount: values.amount }
    : { kind: 'percent', description: values.description, percent: values.percent };
}

/** "The discount is more than the subtotal" comes back on the discount as a whole: show it on the figure. */
function issuePathFor(values: DiscountValues, path: string): string {
  if (path === 'discount' || path === 'discount.amount' || path === 'discount.percent') return values.kind;
  return path.replace(/^discount\./, '');
}

function DiscountForm({ invoice, onDone }: { invoice: InvoiceDto; onDone: () => void }) {
  const existing = currentDiscount(invoice);
  const change = useDraftChange(invoice.id, (discount: DiscountPayload | null) => ({ version: invoice.version, discount }));
  const { form, onSubmit, formError, submitting } = useServerForm({
    schema: discountSchema,
    initialValues: { kind: 'amount', description: existing?.description ?? '', amount: '', percent: '' } as DiscountValues,
    toPayload,
    mutation: change,
    issuePath: (path, values) => issuePathFor(values, path),
    onSuccess: onDone,
  });
  const kind = form.getValues().kind;
  return (
    <form onSubmit={onSubmit} noValidate>
      <Stack gap="md">
        <FormErrorAlert message={formError} />
        {existing && (
          <Text size="sm">
            Now: {existing.description}, {formatMoney(existing.amount)}. Saving replaces it.
          </Text>
        )}
        <SegmentedControl
          aria-label="Discount as"
          data={[
            { value: 'amount', label: 'An amount' },
            { value: 'percent', label: 'A percentage' },
          ]}
          {...form.getInputProps('kind')}
        />
        <TextInput label="Description" placeholder="Neighbour discount" {...form.getInputProps('description')} />
        {kind === 'amount' ? (
          <DecimalInput label="Amount off" prefix="$" {...form.getInputProps('amount')} />
        ) : (
          <DecimalInput label="Percent off" unit="%" description="Of the subtotal, worked out again if lines change." {...form.getInputProps('percent')} />
        )}
        {existing && (
          <Button variant="subtle" color="red" loading={change.isPending && change.variables === null} onClick={() => change.mutate(null, { onSuccess: onDone })}>
            Remove the discount
          </Button>
        )}
        <FormButtons submitLabel="Save discount" submitting={submitting} onCancel={onDone} />
      </Stack>
    </form>
  );
}

export function DiscountModal({ invoice, opened, onClose }: { invoice: InvoiceDto; opened: boolean; onClose: () => void }) {
  return (
    <ActionModal opened={opened} onClose={onClose} title="Discount">
      <DiscountForm invoice={invoice} onDone={onClose} />
    </ActionModal>
  );
}
