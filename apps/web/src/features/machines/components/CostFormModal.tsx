import { useState } from 'react';
import { Button, Group, Modal, Select, SimpleGrid, Stack, TextInput, Textarea } from '@mantine/core';
import { useMediaQuery } from '@mantine/hooks';
import { COST_CATEGORIES } from '@hitchbook/shared/actual-rate';
import { costEntryCreateSchema, type UploadDto } from '@hitchbook/shared/schemas/machines';
import { DecimalInput } from '../../../components/DecimalInput';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { useServerForm } from '../../../lib/form';
import { localDateIso } from '../../../lib/localTime';
import { useCreateCostEntry } from '../api/createCostEntry';
import { useHouseholds } from '../api/listHouseholds';
import { costEntryPayload, type CostFormValues } from '../costForm';
import { COST_CATEGORY_LABELS } from '../labels';
import { ReceiptDropzone } from './ReceiptDropzone';

interface CostFormProps {
  machineId: string;
  /** The signed-in household, offered as the payer. */
  ownPartyId: string | null;
  onDone: () => void;
}

function CostForm({ machineId, ownPartyId, onDone }: CostFormProps) {
  const households = useHouseholds();
  const create = useCreateCostEntry(machineId);
  const [receipt, setReceipt] = useState<UploadDto | null>(null);
  const { form, onSubmit, formError, submitting } = useServerForm({
    schema: costEntryCreateSchema,
    initialValues: {
      category: 'fuel',
      incurredOn: localDateIso(),
      amount: '',
      gallons: '',
      meterHours: '',
      vendor: '',
      paidByPartyId: ownPartyId ?? '',
      improvementLifeYears: '',
      receiptUploadId: '',
      notes: '',
    } as CostFormValues,
    toPayload: costEntryPayload,
    mutation: create,
    onSuccess: onDone,
  });
  const category = form.getValues().category;

  return (
    <form onSubmit={onSubmit} noValidate>
      <Stack gap="md">
        <FormErrorAlert message={formError} />
        <SimpleGrid cols={{ base: 1, sm: 2 }}>
          <Select
            label="Category"
            data={COST_CATEGORIES.map((c) => ({ value: c, label: COST_CATEGORY_LABELS[c] }))}
            allowDeselect={false}
            {...form.getInputProps('category')}
          />
          <TextInput label="Date" type="date" {...form.getInputProps('incurredOn')} />
          <DecimalInput label="Amount" prefix="$" {...form.getInputProps('amount')} />
          {category === 'fuel' && <DecimalInput label="Gallons" unit="gal" {...form.getInputProps('gallons')} />}
          {category === 'improvement' && (
            <DecimalInput label="Written off over" unit="years" inputMode="numeric" {...form.getInputProps('improvementLifeYears')} />
          )}
          <DecimalInput label="Hour meter at the time" unit="h" {...form.getInputProps('meterHours')} />
          <TextInput label="Vendor" {...form.getInputProps('vendor')} />
          <Select
            label="Paid by"
            placeholder="Pick the household that paid"
            data={(households.data ?? []).map((h) => ({ value: h.id, label: h.name }))}
            allowDeselect={false}
            {...form.getInputProps('paidByPartyId')}
          />
        </SimpleGrid>
        <ReceiptDropzone
          receipt={receipt}
          error={form.errors.receiptUploadId}
          onUploaded={(upload) => {
            setReceipt(upload);
            form.setFieldValue('receiptUploadId', upload?.id ?? '');
          }}
        />
        <Textarea label="Notes" autosize minRows={2} {...form.getInputProps('notes')} />
        <Group justify="flex-end">
          <Button variant="default" onClick={onDone}>
            Cancel
          </Button>
          <Button type="submit" loading={submitting}>
            Save cost
          </Button>
        </Group>
      </Stack>
    </form>
  );
}

interface CostFormModalProps extends CostFormProps {
  opened: boolean;
}

export function CostFormModal({ opened, onDone, ...props }: CostFormModalProps) {
  const phone = useMediaQuery('(max-width: 48em)');
  return (
    <Modal opened={opened} onClose={onDone} title="Add a cost" size="lg" fullScreen={phone}>
      {opened && <CostForm onDone={onDone} {...props} />}
    </Modal>
  );
}
