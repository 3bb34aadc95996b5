import { useRef, useState } from 'react';
import { Stack } from '@mantine/core';
import { workEntryCreateSchema, type WorkEntryWithWarnings } from '@hitchbook/shared/schemas/work-entries';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { useServerForm } from '../../../lib/form';
import { localDateIso } from '../../../lib/localTime';
import { useSaveWorkEntry } from '../api/saveWorkEntry';
import { newClientId } from '../clientId';
import { blankEntry, entryIssuePath, newEntryPayload } from '../entryForm';
import { browserStore, readLastUsed, rememberLastUsed } from '../lastUsed';
import { EntryActions, type EntryIntent } from './EntryActions';
import { EntryFields, type EntryOptions } from './EntryFields';

interface NewEntryFormProps {
  userId: string;
  operatorName: string;
  options: EntryOptions;
  onSaved: (entry: WorkEntryWithWarnings) => void;
}

/** A new entry from the cab: one clientId for as long as this entry is being sent, however often. */
export function NewEntryForm({ userId, operatorName, options, onSaved }: NewEntryFormProps) {
  const [clientId] = useState(newClientId);
  const [lastUsed] = useState(() => readLastUsed(browserStore(), userId));
  const intent = useRef<EntryIntent>('submitted');
  const [shownIntent, setShownIntent] = useState<EntryIntent>('submitted');
  const save = useSaveWorkEntry();
  const { form, onSubmit, formError, submitting } = useServerForm({
    schema: workEntryCreateSchema,
    initialValues: blankEntry(localDateIso(), userId, lastUsed),
    toPayload: (values) => newEntryPayload(values, clientId, intent.current),
    mutation: save,
    issuePath: entryIssuePath,
    onSuccess: (entry) => {
      rememberLastUsed(browserStore(), userId, { powerMachineId: entry.powerMachineId, implementMachineId: entry.implementMachineId });
      onSaved(entry);
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
