import 'fake-indexeddb/auto';
import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { ApiError } from '../../lib/api';
import type { NewWorkEntry } from '../work/api/saveWorkEntry';
import { createEntryQueue, type QueuedPhoto } from './entryQueue';
import { payload } from './testPayload';
import { classifyFailure, sendQueue, type SendProgress } from './sendQueue';

const freshQueue = () => createEntryQueue(`send-test-${randomUUID()}`);

/** A server that stores each clientId once, like the API, and can be told how to answer. */
function fakeServer(answer: (p: NewWorkEntry, call: number) => 'ok' | Error = () => 'ok', photoAnswer: (photo: QueuedPhoto) => 'ok' | Error = () => 'ok') {
  const stored = new Map<string, NewWorkEntry>();
  const calls: string[] = [];
  const photos: { entryId: string; name: string }[] = [];
  const server = {
    stored,
    calls,
    photos,
    async sendEntry(p: NewWorkEntry) {
      calls.push(p.clientId);
      const verdict = answer(p, calls.length);
      if (verdict instanceof Error) throw verdict;
      if (!stored.has(p.clientId)) stored.set(p.clientId, p);
      return { id: `entry-of-${p.clientId}` };
    },
    async sendPhoto(entryId: string, photo: QueuedPhoto) {
      const verdict = photoAnswer(photo);
      if (verdict instanceof Error) throw verdict;
      photos.push({ entryId, name: photo.name });
    },
  };
  return server;
}

const photo = (name: string): QueuedPhoto => ({ id: crypto.randomUUID(), name, type: 'image/jpeg', size: 3, blob: new Blob([new Uint8Array([0xff, 0xd8, 0xff])], { type: 'image/jpeg' }) });

describe('sending the queue', () => {
  it('sends waiting entries oldest first and empties the queue', async () => {
    const queue = freshQueue();
    const entries = [payload(), payload(), payload()];
    for (const p of entries) await queue.add('ann', p);
    const server = fakeServer();
    const progress: SendProgress[] = [];
    const run = await sendQueue(queue, 'ann', server, (p) => progress.push(p));
    expect(run).toEqual({ sent: 3, refused: 0, stopped: null });
    expect(server.calls).toEqual(entries.map((p) => p.clientId));
    expect(progress).toEqual([{ done: 0, total: 3 }, { done: 1, total: 3 }, { done: 2, total: 3 }, { done: 3, total: 3 }]);
    expect(await queue.list('ann')).toEqual([]);
  });

  it('keeps everything unsent when the signal drops, and the resend after a lost answer stores one entry', async () => {
    const queue = freshQueue();
    const [first, second] = [payload(), payload()];
    await queue.add('ann', first);
    await queue.add('ann', second);
    // The first entry reaches the server but its answer is lost on the way back.
    const server = fakeServer((p, call) => (call === 1 ? (server.stored.set(p.clientId, p), new ApiError(0, 'No signal.')) : 'ok'));
    const run = await sendQueue(queue, 'ann', server);
    expect(run.stopped).toEqual({ reason: 'offline', message: 'No signal.' });
    expect((await queue.list('ann')).map((e) => [e.clientId, e.state, e.reason])).toEqual([
      [first.clientId, 'waiting', 'No signal.'],
      [second.clientId, 'waiting', null],
    ]);

    const again = await sendQueue(queue, 'ann', server);
    expect(again).toEqual({ sent: 2, refused: 0, stopped: null });
    expect(server.calls).toEqual([first.clientId, first.clientId, second.clientId]);
    expect([...server.stored.keys()]).toEqual([first.clientId, second.clientId]);
  });

  it('keeps a refused entry with the server reason and goes on with the others', async () => {
    const queue = freshQueue();
    const [low, fine] = [payload({ meterStart: '900', meterEnd: '901' }), payload()];
    await queue.add('ann', low);
    await queue.add('ann', fine);
    const refusal = new ApiError(400, 'The meter start 900 is below the last reading 1204.', [{ path: 'meterStart', message: 'Below 1204.' }]);
    const server = fakeServer((p) => (p.clientId === low.clientId ? refusal : 'ok'));
    const run = await sendQueue(queue, 'ann', server);
    expect(run).toEqual({ sent: 1, refused: 1, stopped: null });
    const [kept] = await queue.list('ann');
    expect(kept).toMatchObject({ clientId: low.clientId, state: 'refused', reason: refusal.message, issues: refusal.issues });

    // A refused entry is not sent again until it is fixed.
    await sendQueue(queue, 'ann', server);
    expect(server.calls.filter((id) => id === low.clientId)).toHaveLength(1);
  });

  it('stops on an expired sign-in without marking anything refused', async () => {
    const queue = freshQueue();
    const saved = payload();
    await queue.add('ann', saved);
    const server = fakeServer(() => new ApiError(401, 'Please sign in again.'));
    const run = await sendQueue(queue, 'ann', server);
    expect(run.stopped?.reason).toBe('signed-out');
    expect(await queue.get('ann', saved.clientId)).toMatchObject({ state: 'waiting', payload: saved });
  });

  it("sends only the signed-in person's entries", async () => {
    const queue = freshQueue();
    const [anns, bens] = [payload(), payload()];
    await queue.add('ann', anns);
    await queue.add('ben', bens);
    const server = fakeServer();
    await sendQueue(queue, 'ben', server);
    expect(server.calls).toEqual([bens.clientId]);
    expect((await queue.list('ann')).map((e) => e.clientId)).toEqual([anns.clientId]);
  });

  it('sends the photos after their entry and keeps those not yet sent when the signal drops', async () => {
    const queue = freshQueue();
    const saved = payload();
    await queue.add('ann', saved, [photo('gate.jpg'), photo('washout.jpg')]);
    const server = fakeServer(() => 'ok', (p) => (p.name === 'washout.jpg' ? new ApiError(0, 'No signal.') : 'ok'));
    const run = await sendQueue(queue, 'ann', server);
    expect(run.stopped?.reason).toBe('offline');
    const kept = await queue.get('ann', saved.clientId);
    expect(kept).toMatchObject({ state: 'waiting', entryStored: true });
    expect(kept?.photos.map((p) => p.name)).toEqual(['washout.jpg']);
    expect(await kept?.photos[0]!.blob.arrayBuffer()).toEqual(new Uint8Array([0xff, 0xd8, 0xff]).buffer);

    const fine = fakeServer();
    fine.stored.set(saved.clientId, saved);
    expect(await sendQueue(queue, 'ann', fine)).toEqual({ sent: 1, refused: 0, stopped: null });
    expect(fine.photos).toEqual([{ entryId: `entry-of-${saved.clientId}`, name: 'washout.jpg' }]);
    expect(await queue.list('ann')).toEqual([]);
  });

  it('keeps a refused photo with the reason, saying the entry itself reached the office', async () => {
    const queue = freshQueue();
    const saved = payload();
    await queue.add('ann', saved, [photo('blurry.jpg')]);
    const server = fakeServer(() => 'ok', () => new ApiError(400, 'Only JPEG or PNG photos.'));
    expect(await sendQueue(queue, 'ann', server)).toEqual({ sent: 0, refused: 1, stopped: null });
    expect(await queue.get('ann', saved.clientId)).toMatchObject({
      state: 'refused',
      entryStored: true,
      reason: 'The entry reached the office, but the photo blurry.jpg was not accepted: Only JPEG or PNG photos.',
    });
  });
});

describe('what a failed send means', () => {
  it.each([
    [new ApiError(0, 'x'), 'stop', 'offline'],
    [new ApiError(401, 'x'), 'stop', 'signed-out'],
    [new ApiError(429, 'x'), 'stop', 'server'],
    [new ApiError(503, 'x'), 'stop', 'server'],
    [new ApiError(500, 'x'), 'stop', 'server'],
    [new Error('x'), 'stop', 'server'],
  ])('%s is not a verdict on the entry', (error, kind, reason) => {
    expect(classifyFailure(error)).toMatchObject({ kind, reason });
  });

  it.each([400, 403, 404, 409, 413])('a %i is the server refusing the entry', (status) => {
    expect(classifyFailure(new ApiError(status, 'Refused.'))).toEqual({ kind: 'refused', message: 'Refused.' });
  });
});
