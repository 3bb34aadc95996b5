import { openDB, type DBSchema, type IDBPDatabase } from 'idb';
import type { ApiIssue } from '../../lib/api';
import type { NewWorkEntry } from '../work/api/saveWorkEntry';

/** Waiting to be sent, or refused by the server and waiting for the operator to fix or delete it. */
export type QueuedState = 'waiting' | 'refused';

/** A photo of the entry, kept as its bytes until the entry is on the server and the photo sent. */
export interface QueuedPhoto {
  id: string;
  name: string;
  type: string;
  size: number;
  blob: Blob;
}

/** One entry saved on the phone. Its clientId is the one the server sees on every send. */
export interface QueuedEntry {
  clientId: string;
  /** The person who logged it: only they see it, and only their sign-in sends it. */
  userId: string;
  /** Epoch milliseconds when it was saved; entries are sent in this order. */
  queuedAt: number;
  payload: NewWorkEntry;
  state: QueuedState;
  /** The server's reason for a refusal, or why the last try did not get through. */
  reason: string | null;
  issues: ApiIssue[];
  attempts: number;
  /** Photos still to send; each leaves the record once the server has it. */
  photos: QueuedPhoto[];
  /** The server stored the entry; only its photos are left (a refusal then concerns a photo). */
  entryStored: boolean;
}

interface QueueSchema extends DBSchema {
  entries: { key: string; value: QueuedEntry; indexes: { byUser: [string, number] } };
}

export const QUEUE_DB_NAME = 'hitchbook-offline';

/**
 * The on-device queue of work entries, in IndexedDB. Every call names the signed-in person and
 * touches only their entries, so another person on a shared phone can neither see nor send them.
 */
export interface EntryQueue {
  add(userId: string, payload: NewWorkEntry, photos?: QueuedPhoto[], entryStored?: boolean): Promise<QueuedEntry>;
  list(userId: string): Promise<QueuedEntry[]>;
  get(userId: string, clientId: string): Promise<QueuedEntry | null>;
  /** The operator fixed a refused entry: it waits again, under the same clientId. */
  replace(userId: string, clientId: string, payload: NewWorkEntry): Promise<QueuedEntry>;
  markRefused(userId: string, clientId: string, reason: string, issues: ApiIssue[]): Promise<void>;
  /** A try that did not get through (no signal, signed out, server trouble): the entry keeps waiting. */
  markUndelivered(userId: string, clientId: string, reason: string): Promise<void>;
  /** The server stored the entry: from now on only the photos are sent. */
  markEntryStored(userId: string, clientId: string): Promise<void>;
  removePhoto(userId: string, clientId: string, photoId: string): Promise<void>;
  remove(userId: string, clientId: string): Promise<void>;
}

/** Records kept before photos were queued read as entries without photos. */
function complete(entry: QueuedEntry): QueuedEntry {
  return { ...entry, photos: entry.photos ?? [], entryStored: entry.entryStored ?? false };
}

export class QueueError extends Error {}

export function createEntryQueue(dbName = QUEUE_DB_NAME, now: () => number = Date.now): EntryQueue {
  let opened: Promise<IDBPDatabase<QueueSchema>> | null = null;
  const db = () =>
    (opened ??= openDB<QueueSchema>(dbName, 1, {
      upgrade(database) {
        const store = database.createObjectStore('entries', { keyPath: 'clientId' });
        store.createIndex('byUser', ['userId', 'queuedAt']);
      },
    }));

  async function own(userId: string, clientId: string): Promise<QueuedEntry | null> {
    const entry = await (await db()).get('entries', clientId);
    return entry && entry.userId === userId ? complete(entry) : null;
  }

  async function ownOrThrow(userId: string, clientId: string): Promise<QueuedEntry> {
    const entry = await own(userId, clientId);
    if (!entry) throw new QueueError('That entry is no longer on this phone.');
    return entry;
  }

  let lastQueuedAt = 0;
  // Two saves in the same millisecond still keep their order.
  const nextQueuedAt = () => (lastQueuedAt = Math.max(now(), lastQueuedAt + 1));

  return {
    async add(userId, payload, photos = [], entryStored = false) {
      const existing = await (await db()).get('entries', payload.clientId);
      if (existing) throw new QueueError('An entry with this device id is already waiting on this phone.');
      const entry: QueuedEntry = {
        clientId: payload.clientId,
        userId,
        queuedAt: nextQueuedAt(),
        payload,
        state: 'waiting',
        reason: null,
        issues: [],
        attempts: 0,
        photos,
        entryStored,
      };
      await (await db()).add('entries', entry);
      return entry;
    },
    async list(userId) {
      const range = IDBKeyRange.bound([userId, -Infinity], [userId, Infinity]);
      return (await (await db()).getAllFromIndex('entries', 'byUser', range)).map(complete);
    },
    get: own,
    async replace(userId, clientId, payload) {
      const entry = await ownOrThrow(userId, clientId);
      const fixed: QueuedEntry = { ...entry, payload: { ...payload, clientId }, state: 'waiting', reason: null, issues: [] };
      await (await db()).put('entries', fixed);
      return fixed;
    },
    async markRefused(userId, clientId, reason, issues) {
      const entry = await ownOrThrow(userId, clientId);
      await (await db()).put('entries', { ...entry, state: 'refused', reason, issues, attempts: entry.attempts + 1 });
    },
    async markUndelivered(userId, clientId, reason) {
      const entry = await ownOrThrow(userId, clientId);
      await (await db()).put('entries', { ...entry, reason, attempts: entry.attempts + 1 });
    },
    async markEntryStored(userId, clientId) {
      const entry = await ownOrThrow(userId, clientId);
      await (await db()).put('entries', { ...entry, entryStored: true });
    },
    async removePhoto(userId, clientId, photoId) {
      const entry = await ownOrThrow(userId, clientId);
      await (await db()).put('entries', { ...entry, photos: entry.photos.filter((p) => p.id !== photoId) });
    },
    async remove(userId, clientId) {
      await ownOrThrow(userId, clientId);
      await (await db()).delete('entries', clientId);
    },
  };
}
