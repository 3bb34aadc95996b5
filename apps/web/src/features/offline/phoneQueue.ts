import { useSyncExternalStore } from 'react';
import type { NewWorkEntry, saveWorkEntry } from '../work/api/saveWorkEntry';
import type { QueuedEntry } from './entryQueue';
import type { SendProgress, SendRun } from './sendQueue';

// What the shell and the cab form show of the phone's queue, and the calls into it. The queue itself
// (IndexedDB, sending, uploads) is phoneQueueEngine.ts: it is fetched as soon as the signed-in frame mounts,
// right after the first paint, rather than with the cab form, and every call below waits for it.

/** What the shell and the cab form show about the signed-in person's entries on this phone. */
export interface PhoneQueueStatus {
  userId: string | null;
  entries: QueuedEntry[];
  /** Set while a run is sending. */
  progress: SendProgress | null;
  /** Why the last run stopped early, until the next run. */
  stopped: SendRun['stopped'];
}

export type SaveOutcome =
  | { kind: 'saved'; entry: Awaited<ReturnType<typeof saveWorkEntry>>; photosWaiting: number }
  | { kind: 'queued'; waiting: number };

let status: PhoneQueueStatus = { userId: null, entries: [], progress: null, stopped: null };
const listeners = new Set<() => void>();
let engine: Promise<typeof import('./phoneQueueEngine')> | null = null;

const queueEngine = () => (engine ??= import('./phoneQueueEngine'));

export function currentStatus(): PhoneQueueStatus {
  return status;
}

export function updateStatus(patch: Partial<PhoneQueueStatus>): void {
  status = { ...status, ...patch };
  for (const listener of listeners) listener();
}

/** Switches what is shown to the person now signed in; nobody else's entries are ever loaded. */
export function showQueueOf(userId: string | null): void {
  if (status.userId !== userId) updateStatus({ userId, entries: [], progress: null, stopped: null });
  if (userId) void queueEngine().then((queue) => queue.reload(userId));
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
export async function sendWaiting(userId: string): Promise<SendRun> {
  return (await queueEngine()).sendWaiting(userId);
}

/** See phoneQueueEngine's saveOrQueueWorkEntry: sent at once with signal, kept on the phone without. */
export async function saveOrQueueWorkEntry(userId: string, payload: NewWorkEntry, files: readonly File[] = []): Promise<SaveOutcome> {
  return (await queueEngine()).saveOrQueueWorkEntry(userId, payload, files);
}

/** The operator fixed a refused entry; it waits again and goes at once when there is signal. */
export async function fixQueuedEntry(userId: string, clientId: string, payload: NewWorkEntry): Promise<void> {
  return (await queueEngine()).fixQueuedEntry(userId, clientId, payload);
}

export async function deleteQueuedEntry(userId: string, clientId: string): Promise<void> {
  return (await queueEngine()).deleteQueuedEntry(userId, clientId);
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
