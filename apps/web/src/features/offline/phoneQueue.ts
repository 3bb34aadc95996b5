import { useSyncExternalStore } from 'react';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { ApiError, sessionStore } from '../../lib/api';
import { uploadFile } from '../../lib/fileTransfer';
import { queryClient } from '../../lib/queryClient';
import { refreshAfterEntryChange, saveWorkEntry, type NewWorkEntry } from '../work/api/saveWorkEntry';
import { newClientId } from '../work/clientId';
import { createEntryQueue, type QueuedEntry, type QueuedPhoto } from './entryQueue';
import { photoBudgetProblem } from './photoBudget';
import { classifyFailure, sendQueue, type QueueServer, type SendProgress, type SendRun } from './sendQueue';

/** What the shell and the cab form show about the signed-in person's entries on this phone. */
export interface PhoneQueueStatus {
  userId: string | null;
  entries: QueuedEntry[];
  /** Set while a run is sending. */
  progress: SendProgress | null;
  /** Why the last run stopped early, until the next run. */
  stopped: SendRun['stopped'];
}

const queue = createEntryQueue();
let status: PhoneQueueStatus = { userId: null, entries: [], progress: null, stopped: null };
const listeners = new Set<() => void>();
let running: { userId: string; run: Promise<SendRun> } | null = null;

function update(patch: Partial<PhoneQueueStatus>) {
  status = { ...status, ...patch };
  for (const listener of listeners) listener();
}

async function reload(userId: string): Promise<void> {
  const entries = await queue.list(userId);
  if (status.userId === userId) update({ entries });
}

/** Switches what is shown to the person now signed in; nobody else's entries are ever loaded. */
export function showQueueOf(userId: string | null): void {
  if (status.userId !== userId) update({ userId, entries: [], progress: null, stopped: null });
  if (userId) void reload(userId);
}

/**
 * Sends the server only what the same person queued: a run that outlives a sign-out or a
 * change of person stops instead of sending under someone else's sign-in.
 */
function serverAs(userId: string): QueueServer {
  const samePerson = () => (sessionStore.get()?.user.id === userId ? null : new ApiError(401, 'Please sign in again.'));
  return {
    sendEntry: (payload) => samePerson() ? Promise.reject(samePerson()) : saveWorkEntry(payload),
    sendPhoto: (entryId, photo) =>
      samePerson()
        ? Promise.reject(samePerson())
        : uploadFile({ path: `/api/work-entries/${encodeURIComponent(entryId)}/photos`, file: new File([photo.blob], photo.name, { type: photo.type }) }),
  };
}

/** Bytes of photo the shown person has waiting, against the phone's photo budget. */
export function photoBytesWaiting(entries: readonly QueuedEntry[]): number {
  return entries.reduce((sum, entry) => sum + entry.photos.reduce((s, p) => s + p.size, 0), 0);
}

/** Whether the shown person has entries waiting to be sent (refused ones wait for a fix instead). */
export function hasWaiting(userId: string): boolean {
  return status.userId === userId && status.entries.some((entry) => entry.state === 'waiting');
}

/** Sends the waiting entries now; a run already under way is joined, not doubled. */
export function sendWaiting(userId: string): Promise<SendRun> {
  if (running?.userId === userId) return running.run;
  const run = (async () => {
    try {
      const result = await sendQueue(queue, userId, serverAs(userId), (progress) => {
        if (status.userId === userId) update({ progress });
        void reload(userId);
      });
      if (status.userId === userId) update({ stopped: result.stopped });
      if (result.sent > 0) await refreshAfterEntryChange(queryClient);
      return result;
    } finally {
      running = null;
      if (status.userId === userId) update({ progress: null });
      await reload(userId);
    }
  })();
  running = { userId, run };
  return run;
}

export type SaveOutcome =
  | { kind: 'saved'; entry: Awaited<ReturnType<typeof saveWorkEntry>>; photosWaiting: number }
  | { kind: 'queued'; waiting: number };

async function keep(userId: string, payload: NewWorkEntry, photos: QueuedPhoto[]): Promise<SaveOutcome> {
  await queue.add(userId, payload, photos);
  await reload(userId);
  return { kind: 'queued', waiting: status.entries.length };
}

function asQueuedPhotos(files: readonly File[]): QueuedPhoto[] {
  return files.map((file) => ({ id: newClientId(), name: file.name, type: file.type, size: file.size, blob: file }));
}

/**
 * The cab form's save. Without signal, or behind entries still waiting (so the office gets
 * them in order), the entry goes into the phone's queue with its photos. A send that fails for
 * want of signal, sign-in or a working server is queued too, under the same clientId, so if the
 * server did store it the resend is answered with that entry. A refusal is shown on the form as
 * usual. Photos always travel through the queue, after their entry, within the photo budget.
 */
export async function saveOrQueueWorkEntry(userId: string, payload: NewWorkEntry, files: readonly File[] = [], online = navigator.onLine): Promise<SaveOutcome> {
  const entries = await queue.list(userId);
  const overBudget = photoBudgetProblem(files, photoBytesWaiting(entries));
  if (overBudget) throw new ApiError(400, overBudget);
  const photos = asQueuedPhotos(files);
  const behind = entries.some((entry) => entry.state === 'waiting');
  if (!online || behind) {
    const outcome = await keep(userId, payload, photos);
    if (online) void sendWaiting(userId);
    return outcome;
  }
  let entry: Awaited<ReturnType<typeof saveWorkEntry>>;
  try {
    entry = await saveWorkEntry(payload);
  } catch (error) {
    if (classifyFailure(error).kind === 'refused') throw error;
    return keep(userId, payload, photos);
  }
  if (photos.length > 0) {
    await queue.add(userId, payload, photos, true);
    await reload(userId);
    void sendWaiting(userId);
  }
  return { kind: 'saved', entry, photosWaiting: photos.length };
}

/**
 * The cab form's mutation: it runs with or without signal, since without it the entry is queued.
 * `photos` gives the photos picked on the form at the moment of saving.
 */
export function useSaveOrQueueWorkEntry(userId: string, photos: () => readonly File[] = () => []) {
  const client = useQueryClient();
  return useMutation({
    networkMode: 'always',
    mutationFn: (payload: NewWorkEntry) => saveOrQueueWorkEntry(userId, payload, photos()),
    onSuccess: (outcome) => (outcome.kind === 'saved' ? refreshAfterEntryChange(client) : undefined),
  });
}

/** The operator fixed a refused entry; it waits again and goes at once when there is signal. */
export async function fixQueuedEntry(userId: string, clientId: string, payload: NewWorkEntry): Promise<void> {
  await queue.replace(userId, clientId, payload);
  await reload(userId);
  if (navigator.onLine) void sendWaiting(userId);
}

export async function deleteQueuedEntry(userId: string, clientId: string): Promise<void> {
  await queue.remove(userId, clientId);
  await reload(userId);
}

function subscribe(listener: () => void) {
  listeners.add(listener);
  return () => {
    listeners.delete(listener);
  };
}

export function usePhoneQueue(): PhoneQueueStatus {
  return useSyncExternalStore(subscribe, () => status);
}
