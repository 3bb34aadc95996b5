import { useState } from 'react';
import { Box, Button, SimpleGrid, Skeleton } from '@mantine/core';
import { IconList, IconPlus } from '@tabler/icons-react';
import { Link } from 'react-router-dom';
import type { WorkEntryWithWarnings } from '@hitchbook/shared/schemas/work-entries';
import { NotAllowed } from '../../../components/NotAllowed';
import { PageHeader } from '../../../components/PageHeader';
import { QueryError } from '../../../components/QueryError';
import { accessTo } from '../../../lib/areas';
import { useSessionUserOrThrow } from '../../../lib/auth';
import { paths } from '../../../lib/paths';
import { NewEntryForm } from '../components/NewEntryForm';
import { SavedEntryPanel } from '../components/SavedEntryPanel';
import { useEntryOptions } from '../useEntryOptions';

export function Component() {
  const user = useSessionUserOrThrow();
  const { options, error, retry } = useEntryOptions(user.role);
  const [saved, setSaved] = useState<WorkEntryWithWarnings | null>(null);
  // Each pass is a fresh form with a fresh device id; the count only remounts it.
  const [pass, setPass] = useState(0);

  if (accessTo(user.role, 'work') !== 'manage') return <NotAllowed />;

  return (
    <Box maw={720}>
      <PageHeader title="Log work" description="One pass: where, what, with which machines and for how long." />
      {saved ? (
        <SavedEntryPanel entry={saved}>
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
        </SavedEntryPanel>
      ) : error ? (
        <QueryError error={error} onRetry={retry} />
      ) : options ? (
        <NewEntryForm key={pass} userId={user.id} operatorName={user.name} options={options} onSaved={setSaved} />
      ) : (
        <Skeleton h={600} />
      )}
    </Box>
  );
}
