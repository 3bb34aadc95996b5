import { use, useState, type ReactNode } from 'react';
import { Navigate, useLocation } from 'react-router-dom';
import { currentSession, restoreSessionOnce, useAuth } from '../lib/auth';
import { paths } from '../lib/paths';

/** Nothing renders until the refresh cookie has been tried once, so no page flashes as signed out. */
export function SessionRestored({ children }: { children: ReactNode }) {
  use(restoreSessionOnce());
  return children;
}

/** Signed-out visitors go to sign-in and come back to the page they asked for. */
export function RequireSession({ children }: { children: ReactNode }) {
  const { user } = useAuth();
  const location = useLocation();
  if (!user) return <Navigate to={paths.signIn({ next: location.pathname + location.search })} replace />;
  return children;
}

/**
 * A signed-in user who opens sign-in again goes straight to the dashboard. Decided once on arrival:
 * signing in on this page must leave the page itself to send the person on to where they were going.
 */
export function RedirectIfSignedIn({ children }: { children: ReactNode }) {
  const [signedIn] = useState(() => currentSession() !== null);
  if (signedIn) return <Navigate to={paths.dashboard()} replace />;
  return children;
}
