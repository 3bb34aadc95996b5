import { Component, type ErrorInfo, type ReactNode } from 'react';
import { Alert, Button, Container, Stack, Text, Title } from '@mantine/core';
import { IconAlertTriangle, IconDatabaseOff } from '@tabler/icons-react';
import { Navigate, useLocation } from 'react-router-dom';
import { isApiError } from '../lib/api';
import { paths } from '../lib/paths';

/** A route chunk fails to load after a new version was deployed while the tab stayed open. */
function isStaleChunk(error: unknown): boolean {
  return error instanceof TypeError && /dynamically imported module|Importing a module script failed/i.test(error.message);
}

/**
 * The pages a refused or missing record shows. Only signed-in pages read records, so the signed-in frame hands
 * them in and the sign-in page does not load them; elsewhere the server's own words say what happened.
 */
export interface Refusals {
  notAllowed: ReactNode;
  notFound: ReactNode;
}

function RouteError({ error, refusals }: { error: unknown; refusals: Refusals | undefined }) {
  const location = useLocation();

  if (refusals && isApiError(error) && error.status === 403) return refusals.notAllowed;
  if (refusals && isApiError(error) && error.status === 404) return refusals.notFound;
  if (isApiError(error) && error.status === 401) {
    return <Navigate to={paths.signIn({ next: location.pathname + location.search })} replace />;
  }

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

interface BoundaryProps {
  children: ReactNode;
  refusals?: Refusals;
}

interface BoundaryState {
  error: unknown;
  /** The page the error happened on: following a link elsewhere gives the next page a fresh start. */
  pathname: string | null;
}

class Boundary extends Component<BoundaryProps & { pathname: string }, BoundaryState> {
  override state: BoundaryState = { error: null, pathname: null };

  static getDerivedStateFromError(error: unknown): Partial<BoundaryState> {
    return { error: error ?? new Error('Unknown error') };
  }

  static getDerivedStateFromProps(props: { pathname: string }, state: BoundaryState): Partial<BoundaryState> | null {
    if (state.error && state.pathname !== null && state.pathname !== props.pathname) return { error: null, pathname: null };
    if (state.error && state.pathname === null) return { pathname: props.pathname };
    return null;
  }

  override componentDidCatch(error: unknown, info: ErrorInfo) {
    console.error(error, info.componentStack);
  }

  override render() {
    return this.state.error ? <RouteError error={this.state.error} refusals={this.props.refusals} /> : this.props.children;
  }
}

/** What a page shows when it fails to load or render: a page of its own, inside the frame around it. */
export function RouteErrorBoundary({ children, refusals }: BoundaryProps) {
  const { pathname } = useLocation();
  return (
    <Boundary pathname={pathname} refusals={refusals}>
      {children}
    </Boundary>
  );
}
