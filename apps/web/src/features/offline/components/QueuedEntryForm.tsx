import { useEffect } from 'react';
import { Button, Group, Stack } from '@mantine/core';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { EntryFields, type EntryOptions } from '../../work/components/EntryFields';
import { entryIssuePath, newEntryPayload } from '../../work/entryForm';
import { loadEntrySchema } from '../../work/entrySchema';
import { useEntryForm } from '../../work/useEntryForm';
import type { QueuedEntry } from '../entryQueue';
import { fixQueuedEntry } from '../phoneQueue';
import { queuedEntryValues } from '../queuedEntryValues';

interface QueuedEntryFormProps {
  entry: QueuedEntry;
  operatorName: string;
  options: EntryOptions;
  onDone: () => void;
}

/** Fixing an entry the server refused: the same fields, the server's issues on them, the same clientId. */
export function QueuedEntryForm({ entry, operatorName, options, onDone }: QueuedEntryFormProps) {
  const state = entry.payload.state === 'draft' ? 'draft' : 'submitted';
  const { form, onSubmit, formError, submitting } = useEntryForm({
    schema: loadEntrySchema,
    initialValues: queuedEntryValues(entry.payload),
    toPayload: (values) => newEntryPayload(values, entry.clientId, state),
    send: (payload) => fixQueuedEntry(entry.userId, entry.clientId, payload),
    onSuccess: onDone,
  });

  const { setErrors } = form;
  useEffect(() => {
    setErrors(Object.fromEntries(entry.issues.filter((i) => i.path).map((i) => [entryIssuePath(i.path), i.message])));
  }, [entry.issues, setErrors]);

  return (
    <form onSubmit={onSubmit} noValidate data-testid="queued-entry-form">
      <Stack gap="md">
        <EntryFields form={form} options={options} operatorName={operatorName} lastUsed={{ powerMachineId: null, implementMachineId: null }} editing />
        <FormErrorAlert message={formError} />
        <Group>
          <Button type="submit" size="lg" loading={submitting}>
            Keep the fix and send
          </Button>
          <Button variant="default" size="lg" onClick={onDone}>
            Cancel
          </Button>
        </Group>
      </Stack>
    </form>
  );
}
