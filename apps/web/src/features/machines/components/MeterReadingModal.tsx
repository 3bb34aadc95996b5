import { Button, Group, Modal, SegmentedControl, SimpleGrid, Stack, Text, TextInput, Textarea } from '@mantine/core';
import { useMediaQuery } from '@mantine/hooks';
import { meterReadingCreateSchema, type MeterReadingCreateInput } from '@hitchbook/shared/schemas/machines';
import { DecimalInput } from '../../../components/DecimalInput';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { useServerForm } from '../../../lib/form';
import { localDateIso, localInstantIso, localTimeOfDay } from '../../../lib/localTime';
import { useCreateMeterReading } from '../api/createMeterReading';

interface ReadingValues {
  kind: 'reading' | 'reset';
  hours: string;
  day: string;
  time: string;
  offsetHours: string;
  note: string;
}

function toPayload(values: ReadingValues): MeterReadingCreateInput {
  return {
    kind: values.kind,
    hours: values.hours.trim(),
    readAt: localInstantIso(values.day, values.time) ?? undefined,
    offsetHours: values.kind === 'reset' && values.offsetHours.trim() ? values.offsetHours.trim() : undefined,
    note: values.note,
  };
}

// The reading's time is typed as a day and a clock time; a problem with the instant belongs to both.
const issuePath = (path: string) => (path === 'readAt' ? 'day' : path);

function ReadingForm({ machineId, onDone }: { machineId: string; onDone: () => void }) {
  const create = useCreateMeterReading(machineId);
  const now = new Date();
  const { form, onSubmit, formError, submitting } = useServerForm({
    schema: meterReadingCreateSchema,
    initialValues: { kind: 'reading', hours: '', day: localDateIso(now), time: localTimeOfDay(now), offsetHours: '', note: '' } as ReadingValues,
    toPayload,
    mutation: create,
    onSuccess: onDone,
    issuePath,
  });
  const reset = form.getValues().kind === 'reset';
  return (
    <form onSubmit={onSubmit} noValidate>
      <Stack gap="md">
        <FormErrorAlert message={formError} />
        <SegmentedControl
          fullWidth
          data={[
            { value: 'reading', label: 'Meter reading' },
            { value: 'reset', label: 'Meter replaced' },
          ]}
          {...form.getInputProps('kind')}
        />
        {reset && (
          <Text size="sm" c="dimmed">
            A new meter starts again near zero. The machine&apos;s total hours carry on from the old meter, so nothing is lost.
          </Text>
        )}
        <DecimalInput label={reset ? 'New meter shows' : 'Meter shows'} unit="h" autoFocus {...form.getInputProps('hours')} />
        {reset && (
          <DecimalInput
            label="Machine hours when the new meter went in"
            description="Leave empty to carry on from the last total."
            unit="h"
            {...form.getInputProps('offsetHours')}
          />
        )}
        <SimpleGrid cols={2}>
          <TextInput label="Day" type="date" {...form.getInputProps('day')} />
          <TextInput label="Time" type="time" {...form.getInputProps('time')} />
        </SimpleGrid>
        <Textarea label="Note" autosize minRows={1} {...form.getInputProps('note')} />
        <Group justify="flex-end">
          <Button variant="default" onClick={onDone}>
            Cancel
          </Button>
          <Button type="submit" loading={submitting}>
            {reset ? 'Record the new meter' : 'Save reading'}
          </Button>
        </Group>
      </Stack>
    </form>
  );
}

export function MeterReadingModal({ opened, machineId, onClose }: { opened: boolean; machineId: string; onClose: () => void }) {
  const phone = useMediaQuery('(max-width: 48em)');
  return (
    <Modal opened={opened} onClose={onClose} title="Hour meter" fullScreen={phone}>
      {opened && <ReadingForm machineId={machineId} onDone={onClose} />}
    </Modal>
  );
}
