import { Alert, Button, Group, Text } from '@mantine/core';
import { IconAlertTriangle, IconDatabaseOff } from '@tabler/icons-react';
import { isApiError } from '../lib/api';

interface QueryErrorProps {
  error: unknown;
  onRetry?: () => void;
}

/** Why a panel could not load, in plain words, with a retry where one can help. */
export function QueryError({ error, onRetry }: QueryErrorProps) {
  const databaseDown = isApiError(error) && error.status === 503;
  const message = error instanceof Error ? error.message : 'Something went wrong.';
  return (
    <Alert
      color={databaseDown ? 'clay' : 'red'}
      icon={databaseDown ? <IconDatabaseOff /> : <IconAlertTriangle />}
      title={databaseDown ? "The server can't reach its database" : 'This could not be loaded'}
      m="md"
    >
      <Group justify="space-between" align="center" gap="sm">
        <Text size="sm">{message}</Text>
        {onRetry && (
          <Button variant="light" size="sm" onClick={onRetry}>
            Try again
          </Button>
        )}
      </Group>
    </Alert>
  );
}
