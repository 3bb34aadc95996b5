import { lazy, Suspense, useRef, useState } from 'react';
import { Paper, Stack, Title } from '@mantine/core';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { localDateIso } from '../../../lib/localTime';
import { useLoaded } from '../../../lib/useLoaded';
import { PHOTO_BUDGET } from '../../offline/photoBudget';
import { saveOrQueueWorkEntry, type SaveOutcome } from '../../offline/phoneQueue';
import { getLastMeterReading } from '../api/lastMeterReading';
import { newClientId } from '../clientId';
import { blankEntry, newEntryPayload } from '../entryForm';
import { loadEntrySchema } from '../entrySchema';
import { browserStore, readLastUsed, rememberLastUsed } from '../lastUsed';
import { useEntryForm } from '../useEntryForm';
import { EntryActions, type EntryIntent } from './EntryActions';
import { EntryFields, type EntryOptions } from './EntryFields';

// Photos are the last section of the form: their picker loads once the fields above it are drawn.
const PhotoPicker = lazy(() => import('./PhotoPicker').then((module) => ({ default: module.PhotoPicker })));

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
  const { form, onSubmit, formError, submitting } = useEntryForm({
    schema: loadEntrySchema,
    initialValues: blankEntry(localDateIso(), userId, lastUsed),
    toPayload: (values) => newEntryPayload(values, clientId, intent.current),
    send: (payload) => saveOrQueueWorkEntry(userId, payload, picked.current),
    onSuccess: (outcome, values) => {
      rememberLastUsed(browserStore(), userId, { powerMachineId: values.powerMachineId || null, implementMachineId: values.implementMachineId || null });
      onSaved(outcome);
    },
  });

  const { timing, powerMachineId } = form.getValues();
  const meterOf = timing === 'meter' && powerMachineId ? powerMachineId : null;
  const lastReading = useLoaded(meterOf, (signal) => getLastMeterReading(meterOf!, signal));

  return (
    <form onSubmit={onSubmit} noValidate>
      <Stack gap="md">
        <EntryFields form={form} options={options} operatorName={operatorName} lastUsed={lastUsed} editing={false} lastReading={lastReading.data} />
        <Paper withBorder radius="md" p="md">
          <Stack gap="md">
            <Title order={2} size="h4">
              Photos
            </Title>
            <Suspense fallback={null}>
              <PhotoPicker files={photos} onChange={setPhotos} disabled={submitting} limits={PHOTO_BUDGET} />
            </Suspense>
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
