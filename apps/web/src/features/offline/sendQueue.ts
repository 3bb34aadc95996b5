import { isApiError } from '../../lib/api';
import type { NewWorkEntry } from '../work/api/saveWorkEntry';
import type { EntryQueue, QueuedPhoto } from './entryQueue';

/** Why a run stopped before the end: every entry not yet sent is still on the phone. */
export type StopReason = 'offline' | 'signed-out' | 'server';

export interface SendRun {
  sent: number;
  refused: number;
  /** Null when every waiting entry got an answer. */
  stopped: { reason: StopReason; message: string } | null;
}

/** The server's side of a send: the entry (answered with its id, also on a resend) and each photo of it. */
export interface QueueServer {
  sendEntry(payload: NewWorkEntry): Promise<{ id: string }>;
  sendPhoto(entryId: string, photo: QueuedPhoto): Promise<unknown>;
}

export interface SendProgress {
  done: number;
  total: number;
}

/**
 * What a failed send means for the entry. A 4xx answer is the server's verdict on this entry
 * (a meter reading below one logged meanwhile, a machine since retired): resending will not
 * change it, so the entry waits for the operator. Anything else says nothing about the entry.
 */
export function classifyFailure(error: unknown): { kind: 'refused'; message: string } | { kind: 'stop'; reason: StopReason; message: string } {
  if (!isApiError(error)) return { kind: 'stop', reason: 'server', message: 'The entry could not be sent. It stays on this phone.' };
  if (error.status === 0) return { kind: 'stop', reason: 'offline', message: error.message };
  if (error.status === 401) return { kind: 'stop', reason: 'signed-out', message: 'Sign in again to send the entries waiting on this phone.' };
  // Throttled or timed out: the same request may well pass later.
  if (error.status === 408 || error.status === 429 || error.status >= 500) return { kind: 'stop', reason: 'server', message: error.message };
  return { kind: 'refused', message: error.message };
}

/**
 * Sends one person's waiting entries oldest first, each with its own clientId, so a resend after
 * a lost answer is taken by the server as the same entry, then the entry's photos one by one.
 * Sent entries leave the queue; refused ones stay, marked with the server's reason; a lost
 * connection or sign-in stops the run with the rest untouched.
 */
export async function sendQueue(
  queue: EntryQueue,
  userId: string,
  server: QueueServer,
  onProgress: (progress: SendProgress) => void = () => undefined,
): Promise<SendRun> {
  const waiting = (await queue.list(userId)).filter((entry) => entry.state === 'waiting');
  const run: SendRun = { sent: 0, refused: 0, stopped: null };
  onProgress({ done: 0, total: waiting.length });
  for (const [index, entry] of waiting.entries()) {
    let photoName: string | null = null;
    try {
      // Sent again even when stored: the clientId makes the server answer with the entry's id.
      const stored = await server.sendEntry(entry.payload);
      if (!entry.entryStored && entry.photos.length > 0) await queue.markEntryStored(userId, entry.clientId);
      for (const photo of entry.photos) {
        photoName = photo.name;
        await server.sendPhoto(stored.id, photo);
        await queue.removePhoto(userId, entry.clientId, photo.id);
      }
      await queue.remove(userId, entry.clientId);
      run.sent += 1;
    } catch (error) {
      const failure = classifyFailure(error);
      if (failure.kind === 'stop') {
        await queue.markUndelivered(userId, entry.clientId, failure.message);
        run.stopped = { reason: failure.reason, message: failure.message };
        return run;
      }
      const reason = photoName ? `The entry reached the office, but the photo ${photoName} was not accepted: ${failure.message}` : failure.message;
      await queue.markRefused(userId, entry.clientId, reason, isApiError(error) && !photoName ? error.issues : []);
      run.refused += 1;
    }
    onProgress({ done: index + 1, total: waiting.length });
  }
  return run;
}
