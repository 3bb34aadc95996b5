import type { SessionUser } from '@hitchbook/shared/schemas/auth';
import { ENTRY_DATA_CACHE } from '../features/offline/cacheNames';
import type { Session, SessionStore } from './api';

const REMEMBERED_KEY = 'hitchbook.phone-user';

type KeyValueStore = Pick<Storage, 'getItem' | 'setItem' | 'removeItem'>;

function storage(): KeyValueStore | null {
  try {
    return globalThis.localStorage ?? null;
  } catch {
    return null;
  }
}

/** The person last signed in on this phone, so the cab form still opens after a reload without signal. */
export function readPhoneUser(store: KeyValueStore | null = storage()): SessionUser | null {
  try {
    const raw = store?.getItem(REMEMBERED_KEY);
    const user = raw ? (JSON.parse(raw) as SessionUser) : null;
    return user && typeof user.id === 'string' && typeof user.operationId === 'string' ? user : null;
  } catch {
    return null;
  }
}

/**
 * A session with no token: the server cannot be asked, so nothing is loaded but what the
 * service worker kept and nothing is sent but into the on-device queue. The first request
 * once the signal is back refreshes it through the cookie or ends it.
 */
export function offlineSession(user: SessionUser): Session {
  return { accessToken: '', expiresAt: 0, user };
}

export function isOfflineSession(session: Session | null): boolean {
  return session !== null && session.accessToken === '';
}

async function deleteEntryDataCache(): Promise<void> {
  if (typeof caches === 'undefined') return;
  await caches.delete(ENTRY_DATA_CACHE).catch(() => false);
}

/**
 * Keeps the remembered person in step with real sign-ins. When someone else signs in on the
 * phone, the previous person's kept reads are deleted before the new person can see them.
 */
export function rememberPhoneUser(sessionStore: SessionStore, store: KeyValueStore | null = storage()): () => void {
  return sessionStore.subscribe(() => {
    const session = sessionStore.get();
    if (!session || isOfflineSession(session)) return;
    const previous = readPhoneUser(store);
    if (previous?.id === session.user.id && previous.operationId === session.user.operationId) return;
    if (previous) void deleteEntryDataCache();
    store?.setItem(REMEMBERED_KEY, JSON.stringify(session.user));
  });
}

/** Signing out on purpose: the phone forgets the person and their kept reads (their queue waits for them). */
export async function forgetPhoneUser(store: KeyValueStore | null = storage()): Promise<void> {
  store?.removeItem(REMEMBERED_KEY);
  await deleteEntryDataCache();
}
