import { Modal, SegmentedControl, SimpleGrid, Stack, Text, TextInput } from '@mantine/core';
import { useMediaQuery } from '@mantine/hooks';
import { useNavigate } from 'react-router-dom';
import { squareUpCreateSchema, type FixedCostsBy, type SquareUpCreateInput } from '@hitchbook/shared/schemas/square-ups';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { useServerForm } from '../../../lib/form';
import { paths } from '../../../lib/paths';
import { useCreateSquareUp } from '../api/createSquareUp';
import { FormActions } from './FormActions';

interface PeriodValues {
  name: string;
  periodFrom: string;
  periodTo: string;
  fixedCostsBy: FixedCostsBy;
}

function PeriodForm({ onDone }: { onDone: () => void }) {
  const navigate = useNavigate();
  const create = useCreateSquareUp();
  const { form, onSubmit, formError, submitting } = useServerForm({
    schema: squareUpCreateSchema,
    initialValues: { name: '', periodFrom: '', periodTo: '', fixedCostsBy: 'ownership' } as PeriodValues,
    toPayload: (values: PeriodValues): SquareUpCreateInput => values,
    mutation: create,
    onSuccess: (created) => {
      onDone();
      navigate(paths.squareUp(created.id));
    },
  });
  return (
    <form onSubmit={onSubmit} noValidate>
      <Stack gap="md">
        <FormErrorAlert message={formError} />
        <TextInput label="Name" placeholder="Harvest 2026" {...form.getInputProps('name')} />
        <SimpleGrid cols={{ base: 1, xs: 2 }} spacing="md">
          <TextInput type="date" label="From" {...form.getInputProps('periodFrom')} />
          <TextInput type="date" label="To" {...form.getInputProps('periodTo')} />
        </SimpleGrid>
        <Stack gap={4}>
          <Text size="sm" fw={500}>
            Fixed costs are split
          </Text>
          <SegmentedControl
            aria-label="Fixed costs are split"
            data={[
              { value: 'ownership', label: 'By ownership shares' },
              { value: 'use', label: 'By use' },
            ]}
            {...form.getInputProps('fixedCostsBy')}
          />
          <Text size="sm" c="dimmed">
            Operating costs are always split by use. Split fixed costs by use only when the owners agreed to it.
          </Text>
        </Stack>
        <FormActions submitLabel="Open the period" submitting={submitting} onCancel={onDone} />
      </Stack>
    </form>
  );
}

export function NewPeriodModal({ opened, onClose }: { opened: boolean; onClose: () => void }) {
  const phone = useMediaQuery('(max-width: 48em)');
  return (
    <Modal opened={opened} onClose={onClose} title="New square-up period" fullScreen={phone} size="lg">
      {opened && <PeriodForm onDone={onClose} />}
    </Modal>
  );
}
