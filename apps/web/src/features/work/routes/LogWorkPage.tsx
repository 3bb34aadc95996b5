import { useState } from 'react';
import { Box, Button, SimpleGrid, Skeleton } from '@mantine/core';
import { IconList, IconPlus } from '@tabler/icons-react';
import { Link } from 'react-router-dom';
import { NotAllowed } from '../../../components/NotAllowed';
import { PageHeader } from '../../../components/PageHeader';
import { QueryError } from '../../../components/QueryError';
import { accessTo } from '../../../lib/areas';
import { useSessionUserOrThrow } from '../../../lib/auth';
import { paths } from '../../../lib/paths';
import { PhoneQueueList } from '../../offline/components/PhoneQueueList';
import { PhoneQueueStatus } from '../../offline/components/PhoneQueueStatus';
import { QueuedPanel } from '../../offline/components/QueuedPanel';
import type { SaveOutcome } from '../../offline/phoneQueue';
import { NewEntryForm } from '../components/NewEntryForm';
import { SavedEntryPanel } from '../components/SavedEntryPanel';
import { useEntryOptions } from '../useEntryOptions';

export function Component() {
  const user = useSessionUserOrThrow();
  const { options, error, retry } = useEntryOptions(user.role);
  const [saved, setSaved] = useState<SaveOutcome | null>(null);
  // Each pass is a fresh form with a fresh device id; the count only remounts it.
  const [pass, setPass] = useState(0);

  if (accessTo(user.role, 'work') !== 'manage') return <NotAllowed />;

  const nextPass = (
    <SimpleGrid cols={{ base: 1, xs: 2 }} spacing="sm">
      <Button
        size="xl"
        leftSection={<IconPlus />}
        onClick={() => {
          setSaved(null);
          setPass((n) => n + 1);
        }}
      >
        Log the next pass
      </Button>
      <Button size="xl" variant="default" component={Link} to={paths.work.entries()} leftSection={<IconList />}>
        See the entries
      </Button>
    </SimpleGrid>
  );

  return (
    <Box maw={720}>
      <PageHeader title="Log work" description="One pass: where, what, with which machines and for how long." />
      <PhoneQueueStatus showLink={false} />
      {saved ? (
        saved.kind === 'saved' ? (
          <SavedEntryPanel entry={saved.entry}>{nextPass}</SavedEntryPanel>
        ) : (
          <QueuedPanel>{nextPass}</QueuedPanel>
        )
      ) : error ? (
        <QueryError error={error} onRetry={retry} />
      ) : options ? (
        <NewEntryForm key={pass} userId={user.id} operatorName={user.name} options={options} onSaved={setSaved} />
      ) : (
        <Skeleton h={600} />
      )}
      <Box mt="xl">
        <PhoneQueueList options={options} operatorName={user.name} />
      </Box>
    </Box>
  );
}
