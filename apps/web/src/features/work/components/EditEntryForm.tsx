import { useRef, useState } from 'react';
import { Stack } from '@mantine/core';
import { useQueryClient } from '@tanstack/react-query';
import { workEntryUpdateSchema, type WorkEntryWithWarnings } from '@hitchbook/shared/schemas/work-entries';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { refreshAfterEntryChange } from '../api/saveWorkEntry';
import { submitWorkEntry } from '../api/submitWorkEntry';
import { updateWorkEntry, type WorkEntryChange } from '../api/updateWorkEntry';
import { entryChangePayload, entryFormValues } from '../entryForm';
import { useEntryForm } from '../useEntryForm';
import { EntryActions, type EntryIntent } from './EntryActions';
import { EntryFields, type EntryOptions } from './EntryFields';

interface EditEntryFormProps {
  entry: WorkEntryWithWarnings;
  operatorName: string;
  options: EntryOptions;
  onSaved: (entry: WorkEntryWithWarnings) => void;
}

/** Fixing a draft or a submitted entry; a draft can be sent on for approval in the same step. */
export function EditEntryForm({ entry, operatorName, options, onSaved }: EditEntryFormProps) {
  const queryClient = useQueryClient();
  const intent = useRef<EntryIntent>('draft');
  const [shownIntent, setShownIntent] = useState<EntryIntent>('draft');
  const save = async (change: WorkEntryChange) => {
    const saved = await updateWorkEntry(entry.id, change);
    return intent.current === 'submitted' && saved.state === 'draft' ? submitWorkEntry(saved.id, saved.version) : saved;
  };
  const [initial] = useState(() => entryFormValues(entry));
  const { form, onSubmit, formError, submitting } = useEntryForm({
    schema: workEntryUpdateSchema,
    initialValues: initial,
    toPayload: (values) => entryChangePayload(values, initial, entry.version),
    send: save,
    onSuccess: (saved) => {
      void refreshAfterEntryChange(queryClient);
      onSaved(saved);
    },
  });
  const rig = { powerMachineId: entry.powerMachineId, implementMachineId: entry.implementMachineId };

  return (
    <form onSubmit={onSubmit} noValidate>
      <Stack gap="md">
        <EntryFields form={form} options={options} operatorName={operatorName} lastUsed={rig} editing />
        <FormErrorAlert message={formError} />
        <EntryActions
          submitting={submitting}
          intent={shownIntent}
          onIntent={(next) => {
            intent.current = next;
            setShownIntent(next);
          }}
          submitLabel={entry.state === 'draft' ? 'Save and submit' : null}
          draftLabel="Save changes"
        />
      </Stack>
    </form>
  );
}
