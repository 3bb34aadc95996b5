import { afterEach, describe, expect, it, vi } from 'vitest';
import type { SessionUser } from '@hitchbook/shared/schemas/auth';
import { createSessionStore } from './api';
import { forgetPhoneUser, isOfflineSession, offlineSession, readPhoneUser, rememberPhoneUser } from './offlineSession';

function memoryStore() {
  const values = new Map<string, string>();
  return {
    getItem: (key: string) => values.get(key) ?? null,
    setItem: (key: string, value: string) => void values.set(key, value),
    removeItem: (key: string) => void values.delete(key),
  };
}

const user = (id: string): SessionUser => ({
  id,
  email: `${id}@example.test`,
  name: id,
  role: 'operator',
  operationId: 'op-1',
  operationName: 'Quillback Acres',
  partyId: null,
});

const signedIn = (u: SessionUser) => ({ accessToken: 'token', expiresAt: Date.now() + 600_000, user: u });

function fakeCaches() {
  const deleted: string[] = [];
  vi.stubGlobal('caches', { delete: async (name: string) => (deleted.push(name), true) });
  return deleted;
}

afterEach(() => vi.unstubAllGlobals());

describe('the person remembered on the phone', () => {
  it('is whoever signed in last, and a session resumed from it has no token', () => {
    const store = memoryStore();
    const sessions = createSessionStore();
    rememberPhoneUser(sessions, store);
    sessions.set(signedIn(user('ann')));
    expect(readPhoneUser(store)?.id).toBe('ann');
    const resumed = offlineSession(readPhoneUser(store)!);
    expect(isOfflineSession(resumed)).toBe(true);
    expect(isOfflineSession(signedIn(user('ann')))).toBe(false);
    expect(isOfflineSession(null)).toBe(false);
  });

  it("deletes the kept reads when someone else signs in, not when the same person signs in again", async () => {
    const deleted = fakeCaches();
    const store = memoryStore();
    const sessions = createSessionStore();
    rememberPhoneUser(sessions, store);
    sessions.set(signedIn(user('ann')));
    sessions.set(signedIn(user('ann')));
    expect(deleted).toEqual([]);
    sessions.set(signedIn(user('ben')));
    await vi.waitFor(() => expect(deleted).toEqual(['hitchbook-entry-data']));
    expect(readPhoneUser(store)?.id).toBe('ben');
  });

  it('is not replaced by a resumed session or by signing out', () => {
    const store = memoryStore();
    const sessions = createSessionStore();
    rememberPhoneUser(sessions, store);
    sessions.set(signedIn(user('ann')));
    sessions.set(offlineSession(user('ben')));
    sessions.set(null);
    expect(readPhoneUser(store)?.id).toBe('ann');
  });

  it('is forgotten, with the kept reads, on signing out on purpose', async () => {
    const deleted = fakeCaches();
    const store = memoryStore();
    store.setItem('hitchbook.phone-user', JSON.stringify(user('ann')));
    await forgetPhoneUser(store);
    expect(readPhoneUser(store)).toBeNull();
    expect(deleted).toEqual(['hitchbook-entry-data']);
  });

  it('reads as nobody when the stored value is damaged', () => {
    const store = memoryStore();
    store.setItem('hitchbook.phone-user', '{not json');
    expect(readPhoneUser(store)).toBeNull();
    store.setItem('hitchbook.phone-user', JSON.stringify({ name: 'no id' }));
    expect(readPhoneUser(store)).toBeNull();
  });
});
