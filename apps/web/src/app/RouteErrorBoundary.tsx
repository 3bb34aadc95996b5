import type { ReactNode } from 'react';
import { Navigate, useLocation } from 'react-router-dom';
import { isApiError } from '../lib/api';
import { paths } from '../lib/paths';
import { ErrorBoundary, ErrorPanel } from './ErrorBoundary';

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

  return <ErrorPanel error={error} />;
}

/** What a page shows when it fails to load or render: a page of its own, inside the frame around it. */
export function RouteErrorBoundary({ children, refusals }: { children: ReactNode; refusals?: Refusals }) {
  const { pathname } = useLocation();
  return (
    <ErrorBoundary resetKey={pathname} renderError={(error) => <RouteError error={error} refusals={refusals} />}>
      {children}
    </ErrorBoundary>
  );
}
