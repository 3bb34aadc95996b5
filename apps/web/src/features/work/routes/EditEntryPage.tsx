import { useState } from 'react';
import { Alert, Box, Button, Skeleton, Stack } from '@mantine/core';
import { IconList } from '@tabler/icons-react';
import { Link, useParams } from 'react-router-dom';
import type { WorkEntryWithWarnings } from '@hitchbook/shared/schemas/work-entries';
import { NotAllowed } from '../../../components/NotAllowed';
import { NotFound } from '../../../components/NotFound';
import { PageHeader } from '../../../components/PageHeader';
import { QueryError } from '../../../components/QueryError';
import { isApiError } from '../../../lib/api';
import { accessTo } from '../../../lib/areas';
import { useSessionUserOrThrow } from '../../../lib/auth';
import { paths } from '../../../lib/paths';
import { useWorkEntry } from '../api/getWorkEntry';
import { EditEntryForm } from '../components/EditEntryForm';
import { EntryPhotoGallery } from '../components/EntryPhotoGallery';
import { SavedEntryPanel } from '../components/SavedEntryPanel';
import { STATE_LABELS } from '../labels';
import { useEntryOptions } from '../loadEntryOptions';

const EDITABLE = new Set(['draft', 'submitted']);

export function Component() {
  const { entryId = '' } = useParams();
  const user = useSessionUserOrThrow();
  const entry = useWorkEntry(entryId);
  const { data: options, error, retry } = useEntryOptions(user);
  const [saved, setSaved] = useState<WorkEntryWithWarnings | null>(null);

  if (accessTo(user.role, 'work') !== 'manage') return <NotAllowed />;
  if (entry.isError && isApiError(entry.error) && (entry.error.status === 404 || entry.error.status === 400)) return <NotFound />;
  const backToList = (
    <Button size="lg" variant="default" component={Link} to={paths.work.entries()} leftSection={<IconList />}>
      Back to the entries
    </Button>
  );

  let body;
  if (saved) body = <SavedEntryPanel entry={saved}>{backToList}</SavedEntryPanel>;
  else if (entry.isError || error) body = <QueryError error={entry.error ?? error} onRetry={entry.isError ? () => void entry.refetch() : retry} />;
  else if (!entry.data || !options) body = <Skeleton h={600} />;
  else if (!EDITABLE.has(entry.data.state)) {
    body = (
      <Alert color="slate" title={`This entry is ${STATE_LABELS[entry.data.state].toLowerCase()}`}>
        {entry.data.state === 'approved'
          ? 'An approved entry changes only after an owner or partner reopens it from the work table.'
          : 'It is billed or squared up and can no longer change.'}
      </Alert>
    );
  } else {
    body = <EditEntryForm entry={entry.data} operatorName={entry.data.operatorName} options={options} onSaved={setSaved} />;
  }

  return (
    <Box maw={720}>
      <PageHeader title={entry.data && !EDITABLE.has(entry.data.state) ? 'Work entry' : 'Change an entry'} description={entry.data ? `${entry.data.workDate} · ${entry.data.operatorName}` : undefined} />
      <Stack gap="md">
        {body}
        {entry.data && <EntryPhotoGallery entryId={entry.data.id} editable={EDITABLE.has((saved ?? entry.data).state)} />}
      </Stack>
    </Box>
  );
}
