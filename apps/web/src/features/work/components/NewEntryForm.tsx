import { useRef, useState } from 'react';
import { Stack } from '@mantine/core';
import { workEntryCreateSchema } from '@hitchbook/shared/schemas/work-entries';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { useServerForm } from '../../../lib/form';
import { localDateIso } from '../../../lib/localTime';
import { useSaveOrQueueWorkEntry, type SaveOutcome } from '../../offline/phoneQueue';
import { newClientId } from '../clientId';
import { blankEntry, entryIssuePath, newEntryPayload } from '../entryForm';
import { browserStore, readLastUsed, rememberLastUsed } from '../lastUsed';
import { EntryActions, type EntryIntent } from './EntryActions';
import { EntryFields, type EntryOptions } from './EntryFields';

interface NewEntryFormProps {
  userId: string;
  operatorName: string;
  options: EntryOptions;
  onSaved: (outcome: SaveOutcome) => void;
}

/**
 * A new entry from the cab: one clientId for as long as this entry is being sent, however often,
 * and kept on the phone when there is no signal to send it.
 */
export function NewEntryForm({ userId, operatorName, options, onSaved }: NewEntryFormProps) {
  const [clientId] = useState(newClientId);
  const [lastUsed] = useState(() => readLastUsed(browserStore(), userId));
  const intent = useRef<EntryIntent>('submitted');
  const [shownIntent, setShownIntent] = useState<EntryIntent>('submitted');
  const save = useSaveOrQueueWorkEntry(userId);
  const { form, onSubmit, formError, submitting } = useServerForm({
    schema: workEntryCreateSchema,
    initialValues: blankEntry(localDateIso(), userId, lastUsed),
    toPayload: (values) => newEntryPayload(values, clientId, intent.current),
    mutation: save,
    issuePath: entryIssuePath,
    onSuccess: (outcome, values) => {
      rememberLastUsed(browserStore(), userId, { powerMachineId: values.powerMachineId || null, implementMachineId: values.implementMachineId || null });
      onSaved(outcome);
    },
  });

  return (
    <form onSubmit={onSubmit} noValidate>
      <Stack gap="md">
        <EntryFields form={form} options={options} operatorName={operatorName} lastUsed={lastUsed} editing={false} />
        <FormErrorAlert message={formError} />
        <EntryActions
          submitting={submitting}
          intent={shownIntent}
          onIntent={(next) => {
            intent.current = next;
            setShownIntent(next);
          }}
          submitLabel="Submit for approval"
          draftLabel="Save as draft"
        />
      </Stack>
    </form>
  );
}
