import { Modal, SegmentedControl, Stack, Text, TextInput } from '@mantine/core';
import { useMediaQuery } from '@mantine/hooks';
import dayjs from 'dayjs';
import { formatMoney } from '@hitchbook/shared/money';
import { TRANSFER_METHODS, transferPaidSchema, type StatementTransferDto, type TransferMethod, type TransferPaid } from '@hitchbook/shared/schemas/square-ups';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { useServerForm } from '../../../lib/form';
import { useRecordTransferPaid } from '../api/recordTransferPaid';
import { METHOD_LABELS } from '../labels';
import { FormActions } from './FormActions';

interface PaidValues {
  paidOn: string;
  method: TransferMethod;
  reference: string;
}

const REFERENCE_HINTS: Record<TransferMethod, string> = {
  cheque: 'Cheque number',
  cash: 'Receipt number, if any',
  transfer: 'Bank reference',
};

function PaidForm({ squareUpId, transfer, onDone }: { squareUpId: string; transfer: StatementTransferDto & { id: string }; onDone: () => void }) {
  const record = useRecordTransferPaid(squareUpId, transfer.id);
  const { form, onSubmit, formError, submitting } = useServerForm({
    schema: transferPaidSchema,
    initialValues: { paidOn: dayjs().format('YYYY-MM-DD'), method: 'transfer', reference: '' } as PaidValues,
    toPayload: (values: PaidValues): TransferPaid => ({ ...values, reference: values.reference.trim() ? values.reference : null }),
    mutation: record,
    onSuccess: onDone,
  });
  const method = form.getValues().method;
  return (
    <form onSubmit={onSubmit} noValidate>
      <Stack gap="md">
        <FormErrorAlert message={formError} />
        <Text>
          {transfer.fromName} pays {transfer.toName} <b>{formatMoney(transfer.amount)}</b>
        </Text>
        <SegmentedControl aria-label="Paid by" data={TRANSFER_METHODS.map((m) => ({ value: m, label: METHOD_LABELS[m] }))} {...form.getInputProps('method')} />
        <TextInput type="date" label="Paid on" {...form.getInputProps('paidOn')} />
        <TextInput label="Reference" placeholder={REFERENCE_HINTS[method]} {...form.getInputProps('reference')} />
        <FormActions submitLabel="Record as paid" submitting={submitting} onCancel={onDone} />
      </Stack>
    </form>
  );
}

export function RecordPaidModal({ squareUpId, transfer, onClose }: { squareUpId: string; transfer: (StatementTransferDto & { id: string }) | null; onClose: () => void }) {
  const phone = useMediaQuery('(max-width: 48em)');
  return (
    <Modal opened={transfer !== null} onClose={onClose} title="Record a transfer as paid" fullScreen={phone} size="md">
      {transfer && <PaidForm squareUpId={squareUpId} transfer={transfer} onDone={onClose} />}
    </Modal>
  );
}
