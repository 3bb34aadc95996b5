import { useSyncExternalStore } from 'react';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { ApiError, sessionStore } from '../../lib/api';
import { queryClient } from '../../lib/queryClient';
import { refreshAfterEntryChange, saveWorkEntry, type NewWorkEntry } from '../work/api/saveWorkEntry';
import { createEntryQueue, type QueuedEntry } from './entryQueue';
import { classifyFailure, sendQueue, type SendProgress, type SendRun } from './sendQueue';

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
function sendAs(userId: string) {
  return (payload: NewWorkEntry) => {
    if (sessionStore.get()?.user.id !== userId) return Promise.reject(new ApiError(401, 'Please sign in again.'));
    return saveWorkEntry(payload);
  };
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
      const result = await sendQueue(queue, userId, sendAs(userId), (progress) => {
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

export type SaveOutcome = { kind: 'saved'; entry: Awaited<ReturnType<typeof saveWorkEntry>> } | { kind: 'queued'; waiting: number };

async function keep(userId: string, payload: NewWorkEntry): Promise<SaveOutcome> {
  await queue.add(userId, payload);
  await reload(userId);
  return { kind: 'queued', waiting: status.entries.length };
}

/**
 * The cab form's save. Without signal, or behind entries still waiting (so the office gets
 * them in order), the entry goes into the phone's queue. A send that fails for want of signal,
 * sign-in or a working server is queued too, under the same clientId, so if the server did
 * store it the resend is answered with that entry. A refusal is shown on the form as usual.
 */
export async function saveOrQueueWorkEntry(userId: string, payload: NewWorkEntry, online = navigator.onLine): Promise<SaveOutcome> {
  const behind = (await queue.list(userId)).some((entry) => entry.state === 'waiting');
  if (!online || behind) {
    const outcome = await keep(userId, payload);
    if (online) void sendWaiting(userId);
    return outcome;
  }
  try {
    return { kind: 'saved', entry: await saveWorkEntry(payload) };
  } catch (error) {
    if (classifyFailure(error).kind === 'refused') throw error;
    return keep(userId, payload);
  }
}

/** The cab form's mutation: it runs with or without signal, since without it the entry is queued. */
export function useSaveOrQueueWorkEntry(userId: string) {
  const client = useQueryClient();
  return useMutation({
    networkMode: 'always',
    mutationFn: (payload: NewWorkEntry) => saveOrQueueWorkEntry(userId, payload),
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
