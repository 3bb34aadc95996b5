import { SegmentedControl, SimpleGrid, Stack, Text, TextInput } from '@mantine/core';
import dayjs from 'dayjs';
import { formatMoney } from '@hitchbook/shared/money';
import { MANUAL_PAYMENT_METHODS, manualPaymentSchema, type InvoiceDto } from '@hitchbook/shared/schemas/invoices';
import { DecimalInput } from '../../../components/DecimalInput';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { useServerForm } from '../../../lib/form';
import { useRecordPayment, type ManualPaymentRequest } from '../api/recordPayment';
import { METHOD_LABELS } from '../labels';
import { paymentOverBalance } from '../paymentAmount';
import { ActionModal } from './ActionModal';
import { FormButtons } from './FormButtons';

interface PaymentValues {
  method: ManualPaymentRequest['method'];
  amount: string;
  receivedOn: string;
  reference: string;
}

const REFERENCE_HINTS: Record<PaymentValues['method'], string> = {
  cheque: 'Cheque number',
  cash: 'Receipt number, if any',
  transfer: 'Bank reference',
};

function PaymentForm({ invoice, onDone }: { invoice: InvoiceDto; onDone: () => void }) {
  const record = useRecordPayment(invoice.id);
  const { form, onSubmit, formError, submitting } = useServerForm({
    schema: manualPaymentSchema,
    initialValues: { method: 'cheque', amount: invoice.balance, receivedOn: dayjs().format('YYYY-MM-DD'), reference: '' } as PaymentValues,
    toPayload: (values: PaymentValues): ManualPaymentRequest => ({ ...values, reference: values.reference.trim() ? values.reference : null }),
    check: (values) => {
      const over = paymentOverBalance(values.amount, invoice.balance);
      return over ? { amount: over } : {};
    },
    mutation: record,
    onSuccess: onDone,
  });
  const method = form.getValues().method;
  return (
    <form onSubmit={onSubmit} noValidate>
      <Stack gap="md">
        <FormErrorAlert message={formError} />
        <Text>
          Open balance: <b>{formatMoney(invoice.balance)}</b>
        </Text>
        <SegmentedControl
          aria-label="Paid by"
          data={MANUAL_PAYMENT_METHODS.map((m) => ({ value: m, label: METHOD_LABELS[m] }))}
          {...form.getInputProps('method')}
        />
        <SimpleGrid cols={{ base: 1, xs: 2 }} spacing="md">
          <DecimalInput label="Amount" prefix="$" {...form.getInputProps('amount')} />
          <TextInput type="date" label="Received on" {...form.getInputProps('receivedOn')} />
        </SimpleGrid>
        <TextInput label="Reference" placeholder={REFERENCE_HINTS[method]} {...form.getInputProps('reference')} />
        <FormButtons submitLabel="Record payment" submitting={submitting} onCancel={onDone} />
      </Stack>
    </form>
  );
}

export function RecordPaymentModal({ invoice, opened, onClose }: { invoice: InvoiceDto; opened: boolean; onClose: () => void }) {
  return (
    <ActionModal opened={opened} onClose={onClose} title={`Record a payment on ${invoice.numberLabel}`}>
      <PaymentForm invoice={invoice} onDone={onClose} />
    </ActionModal>
  );
}
