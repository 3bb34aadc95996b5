import { ApiError, sessionStore } from '../../lib/api';
import { uploadFile } from '../../lib/fileTransfer';
import { queryClient } from '../../lib/queryClient';
import { refreshAfterEntryChange, saveWorkEntry, type NewWorkEntry } from '../work/api/saveWorkEntry';
import { newClientId } from '../work/clientId';
import { createEntryQueue, type QueuedPhoto } from './entryQueue';
import { photoBudgetProblem } from './photoBudget';
import { currentStatus, photoBytesWaiting, updateStatus, type SaveOutcome } from './phoneQueue';
import { classifyFailure, sendQueue, type QueueServer, type SendRun } from './sendQueue';

// The phone's queue itself: IndexedDB, sending, uploads. phoneQueue.ts loads it right after the signed-in
// frame is drawn and hands it every call, so no entry waits on it for long and none is lost.

const queue = createEntryQueue();
let running: { userId: string; run: Promise<SendRun> } | null = null;

/** Reads the person's entries into what is shown, unless someone else has signed in meanwhile. */
export async function reload(userId: string): Promise<void> {
  const entries = await queue.list(userId);
  if (currentStatus().userId === userId) updateStatus({ entries });
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

/** Sends the waiting entries now; a run already under way is joined, not doubled. */
export function sendWaiting(userId: string): Promise<SendRun> {
  if (running?.userId === userId) return running.run;
  const run = (async () => {
    try {
      const result = await sendQueue(queue, userId, serverAs(userId), (progress) => {
        if (currentStatus().userId === userId) updateStatus({ progress });
        void reload(userId);
      });
      if (currentStatus().userId === userId) updateStatus({ stopped: result.stopped });
      if (result.sent > 0) await refreshAfterEntryChange(queryClient);
      return result;
    } finally {
      running = null;
      if (currentStatus().userId === userId) updateStatus({ progress: null });
      await reload(userId);
    }
  })();
  running = { userId, run };
  return run;
}

async function keep(userId: string, payload: NewWorkEntry, photos: QueuedPhoto[]): Promise<SaveOutcome> {
  await queue.add(userId, payload, photos);
  await reload(userId);
  return { kind: 'queued', waiting: currentStatus().entries.length };
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
