import { Alert } from '@mantine/core';
import { IconDatabaseOff } from '@tabler/icons-react';
import { useDatabaseDown } from '../lib/serviceStatus';

/** Shown while the last server answer was a 503, and gone with the next good answer. */
export function DatabaseDownNotice() {
  const down = useDatabaseDown();
  if (!down) return null;
  return (
    <Alert color="clay" icon={<IconDatabaseOff />} title="The server can't reach its database" mb="md" role="status">
      Nothing you entered is lost. Saving and loading will work again once the database is back; try again in a few
      minutes.
    </Alert>
  );
}
