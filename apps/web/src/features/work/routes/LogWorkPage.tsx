import { Button } from '@mantine/core';
import { IconList } from '@tabler/icons-react';
import { useQueryClient } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { NotAllowed } from '../../../components/NotAllowed';
import { accessTo } from '../../../lib/areas';
import { useSessionUserOrThrow } from '../../../lib/auth';
import { paths } from '../../../lib/paths';
import { refreshAfterEntryChange } from '../api/saveWorkEntry';
import { LogWorkPanel } from '../components/LogWorkPanel';

/** The cab form inside the office app's frame; opened directly, the same form comes as the lean cab page. */
export function Component() {
  const user = useSessionUserOrThrow();
  const queryClient = useQueryClient();
  if (accessTo(user.role, 'work') !== 'manage') return <NotAllowed />;
  return (
    <LogWorkPanel
      user={user}
      onSaved={(outcome) => (outcome.kind === 'saved' ? void refreshAfterEntryChange(queryClient) : undefined)}
      seeEntries={
        <Button size="xl" variant="default" component={Link} to={paths.work.entries()} leftSection={<IconList />}>
          See the entries
        </Button>
      }
    />
  );
}
