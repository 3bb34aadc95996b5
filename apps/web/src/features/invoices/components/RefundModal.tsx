import { Stack, Text, TextInput } from '@mantine/core';
import { Decimal } from 'decimal.js';
import { formatMoney } from '@hitchbook/shared/money';
import { paymentRefundSchema, type PaymentDto } from '@hitchbook/shared/schemas/invoices';
import { DecimalInput } from '../../../components/DecimalInput';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { useServerForm } from '../../../lib/form';
import { useRefundPayment, type RefundRequest } from '../api/refundPayment';
import { ActionModal } from './ActionModal';
import { FormButtons } from './FormButtons';

interface RefundValues {
  amount: string;
  reason: string;
}

/** What of a card payment can still go back to the payer. */
export function refundableOf(payment: Pick<PaymentDto, 'method' | 'amount' | 'amountRefunded'>): string | null {
  if (payment.method !== 'card') return null;
  const left = new Decimal(payment.amount).minus(payment.amountRefunded);
  return left.gt(0) ? left.toFixed(2) : null;
}

function RefundForm({ invoiceId, payment, onDone }: { invoiceId: string; payment: PaymentDto; onDone: () => void }) {
  const refund = useRefundPayment(invoiceId, payment.id);
  const left = refundableOf(payment) ?? '0.00';
  const { form, onSubmit, formError, submitting } = useServerForm({
    schema: paymentRefundSchema,
    initialValues: { amount: left, reason: '' } as RefundValues,
    toPayload: (values: RefundValues): RefundRequest => ({ amount: values.amount, reason: values.reason.trim() ? values.reason : null }),
    check: (values) => {
      try {
        return new Decimal(values.amount).gt(left) ? { amount: `At most the ${formatMoney(left)} not yet refunded.` } : {};
      } catch {
        return {};
      }
    },
    mutation: refund,
    onSuccess: onDone,
  });
  return (
    <form onSubmit={onSubmit} noValidate>
      <Stack gap="md">
        <FormErrorAlert message={formError} />
        <Text>
          The money goes back to the card it came from. Not yet refunded: <b>{formatMoney(left)}</b>
        </Text>
        <Text size="sm" c="dimmed">
          The invoice then counts the refunded amount as unpaid again. When the customer should not owe it any more, also
          correct the invoice with a credit note.
        </Text>
        <DecimalInput label="Amount to refund" prefix="$" {...form.getInputProps('amount')} />
        <TextInput label="Reason" placeholder="Shown in the payment's history" {...form.getInputProps('reason')} />
        <FormButtons submitLabel="Refund to card" submitting={submitting} onCancel={onDone} />
      </Stack>
    </form>
  );
}

export function RefundModal({ invoiceId, payment, onClose }: { invoiceId: string; payment: PaymentDto | null; onClose: () => void }) {
  return (
    <ActionModal opened={payment !== null} onClose={onClose} title="Refund a card payment">
      {payment && <RefundForm invoiceId={invoiceId} payment={payment} onDone={onClose} />}
    </ActionModal>
  );
}
