import { createContext, useCallback, useContext, useMemo, useSyncExternalStore, type ReactNode } from 'react';
import type { SessionUser } from '@hitchbook/shared/schemas/auth';
import { api, isApiError, sessionStore, type Session } from './api';
import { forgetPhoneUser, offlineSession, readPhoneUser, rememberPhoneUser } from './offlineSession';
import { noteServerError, noteServerSuccess } from './serviceStatus';

let restoring: Promise<void> | null = null;

// The query cache arrives with the signed-in frame; the sign-in page must not load it just to empty it.
const cacheClearers = new Set<() => void>();

/** Cached rows belong to one person: whatever holds them registers here to be emptied when the person changes. */
export function clearOnAccountChange(clear: () => void): void {
  cacheClearers.add(clear);
}

function clearCaches(): void {
  for (const clear of cacheClearers) clear();
}

rememberPhoneUser(sessionStore);

/**
 * Asks the server once per page load whether the refresh cookie still holds a session. An
 * outage is remembered for the notice and treated as signed out, so the sign-in page shows.
 */
export function restoreSessionOnce(): Promise<void> {
  restoring ??= api.refreshSession().then(
    () => noteServerSuccess(),
    (error: unknown) => {
      noteServerError(error);
      // No signal, or no server behind it: the person last signed in here keeps the cab form and their queue.
      const phoneUser = isApiError(error) && [0, 502, 503, 504].includes(error.status) ? readPhoneUser() : null;
      if (phoneUser) sessionStore.set(offlineSession(phoneUser));
    },
  );
  return restoring;
}

export function currentSession(): Session | null {
  return sessionStore.get();
}

interface AuthValue {
  user: SessionUser | null;
  signIn: (email: string, password: string) => Promise<SessionUser>;
  acceptInvitation: (input: { token: string; name: string; password: string }) => Promise<SessionUser>;
  signOut: () => Promise<void>;
}

const AuthContext = createContext<AuthValue | null>(null);

export function AuthProvider({ children }: { children: ReactNode }) {
  const session = useSyncExternalStore(sessionStore.subscribe, sessionStore.get);

  const signIn = useCallback(async (email: string, password: string) => {
    clearCaches();
    return (await api.signIn('/api/auth/login', { email, password })).user;
  }, []);

  const acceptInvitation = useCallback(async (input: { token: string; name: string; password: string }) => {
    clearCaches();
    return (await api.signIn('/api/auth/invitations/accept', input)).user;
  }, []);

  const signOut = useCallback(async () => {
    try {
      await api.signOut();
    } finally {
      await forgetPhoneUser();
      // Cached rows belong to the person leaving; the next sign-in must not see them.
      clearCaches();
    }
  }, []);

  const value = useMemo(
    () => ({ user: session?.user ?? null, signIn, acceptInvitation, signOut }),
    [session, signIn, acceptInvitation, signOut],
  );
  return <AuthContext.Provider value={value}>{children}</AuthContext.Provider>;
}

export function useAuth(): AuthValue {
  const value = useContext(AuthContext);
  if (!value) throw new Error('useAuth needs an AuthProvider above it.');
  return value;
}

/** For screens that only render inside the signed-in layout. */
export function useSessionUserOrThrow(): SessionUser {
  const { user } = useAuth();
  if (!user) throw new Error('This screen needs a signed-in user.');
  return user;
}
