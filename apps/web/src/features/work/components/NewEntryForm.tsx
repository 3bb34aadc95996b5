import { useRef, useState } from 'react';
import { Paper, Stack, Title } from '@mantine/core';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { useServerForm } from '../../../lib/form';
import { localDateIso } from '../../../lib/localTime';
import { PHOTO_BUDGET } from '../../offline/photoBudget';
import { useSaveOrQueueWorkEntry, type SaveOutcome } from '../../offline/phoneQueue';
import { newClientId } from '../clientId';
import { blankEntry, entryIssuePath, newEntryPayload } from '../entryForm';
import { loadEntrySchema } from '../entrySchema';
import { browserStore, readLastUsed, rememberLastUsed } from '../lastUsed';
import { EntryActions, type EntryIntent } from './EntryActions';
import { EntryFields, type EntryOptions } from './EntryFields';
import { PhotoPicker } from './PhotoPicker';

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
  const [photos, setPhotos] = useState<File[]>([]);
  // Read when the form is sent: the photos go with the entry, after it, through the phone's queue.
  const picked = useRef(photos);
  picked.current = photos;
  const save = useSaveOrQueueWorkEntry(userId, () => picked.current);
  const { form, onSubmit, formError, submitting } = useServerForm({
    schema: loadEntrySchema,
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
        <Paper withBorder radius="md" p="md">
          <Stack gap="md">
            <Title order={2} size="h4">
              Photos
            </Title>
            <PhotoPicker files={photos} onChange={setPhotos} disabled={submitting} limits={PHOTO_BUDGET} />
          </Stack>
        </Paper>
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
