import { Component, type ErrorInfo, type ReactNode } from 'react';
import { Alert, Button, Container, Stack, Text, Title } from '@mantine/core';
import { IconAlertTriangle, IconDatabaseOff } from '@tabler/icons-react';
import { isApiError } from '../lib/api';

/** A route chunk fails to load after a new version was deployed while the tab stayed open. */
function isStaleChunk(error: unknown): boolean {
  return error instanceof TypeError && /dynamically imported module|Importing a module script failed/i.test(error.message);
}

/** What a page that failed to load or render says, and a reload. Needs no router: the cab and sign-in pages use it too. */
export function ErrorPanel({ error }: { error: unknown }) {
  const databaseDown = isApiError(error) && error.status === 503;
  const refused = isApiError(error) && (error.status === 403 || error.status === 404);
  const staleChunk = isStaleChunk(error);
  return (
    <Container size="sm" py="xl">
      <Stack gap="md">
        <Title order={1} size="h2">
          {databaseDown ? "The server can't reach its database" : staleChunk ? 'Hitchbook was updated' : 'Something went wrong'}
        </Title>
        <Alert color={databaseDown ? 'clay' : 'red'} icon={databaseDown ? <IconDatabaseOff /> : <IconAlertTriangle />}>
          <Text>
            {databaseDown
              ? 'Nothing is lost. Try again in a few minutes.'
              : staleChunk
                ? 'Reload the page to get the new version.'
                : refused && isApiError(error)
                  ? error.message
                  : 'This screen hit an unexpected problem. Reloading usually helps; if it keeps happening, tell the account owner what you were doing.'}
          </Text>
        </Alert>
        <Button onClick={() => window.location.reload()} w="fit-content">
          Reload
        </Button>
      </Stack>
    </Container>
  );
}

interface ErrorBoundaryProps {
  children: ReactNode;
  /** A new key (the page's path) gives the next page a fresh start. */
  resetKey?: string;
  renderError?: (error: unknown) => ReactNode;
}

interface ErrorBoundaryState {
  error: unknown;
  /** The key the error happened under. */
  key: string | null;
}

export class ErrorBoundary extends Component<ErrorBoundaryProps, ErrorBoundaryState> {
  override state: ErrorBoundaryState = { error: null, key: null };

  static getDerivedStateFromError(error: unknown): Partial<ErrorBoundaryState> {
    return { error: error ?? new Error('Unknown error') };
  }

  static getDerivedStateFromProps(props: ErrorBoundaryProps, state: ErrorBoundaryState): Partial<ErrorBoundaryState> | null {
    const key = props.resetKey ?? '';
    if (state.error && state.key !== null && state.key !== key) return { error: null, key: null };
    if (state.error && state.key === null) return { key };
    return null;
  }

  override componentDidCatch(error: unknown, info: ErrorInfo) {
    console.error(error, info.componentStack);
  }

  override render() {
    const { error } = this.state;
    if (!error) return this.props.children;
    return this.props.renderError ? this.props.renderError(error) : <ErrorPanel error={error} />;
  }
}
