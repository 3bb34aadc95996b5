import 'fake-indexeddb/auto';
import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { createEntryQueue } from './entryQueue';
import { payload } from './testPayload';

const freshQueue = (now?: () => number) => createEntryQueue(`queue-test-${randomUUID()}`, now);

describe('the on-device entry queue', () => {
  it('keeps entries in the order they were saved, even within one millisecond', async () => {
    const queue = freshQueue(() => 1_000);
    const first = payload();
    const second = payload();
    const third = payload();
    for (const p of [first, second, third]) await queue.add('ann', p);
    const listed = await queue.list('ann');
    expect(listed.map((e) => e.clientId)).toEqual([first.clientId, second.clientId, third.clientId]);
    expect(listed.every((e) => e.state === 'waiting' && e.reason === null && e.attempts === 0)).toBe(true);
    expect(listed[0]!.payload).toEqual(first);
  });

  it('survives being opened again, as after a reload', async () => {
    const name = `queue-test-${randomUUID()}`;
    const saved = payload();
    await createEntryQueue(name).add('ann', saved);
    expect((await createEntryQueue(name).list('ann')).map((e) => e.clientId)).toEqual([saved.clientId]);
  });

  it("shows, changes and removes only the signed-in person's entries", async () => {
    const queue = freshQueue();
    const anns = payload();
    const bens = payload();
    await queue.add('ann', anns);
    await queue.add('ben', bens);
    expect((await queue.list('ben')).map((e) => e.clientId)).toEqual([bens.clientId]);
    expect(await queue.get('ben', anns.clientId)).toBeNull();
    await expect(queue.remove('ben', anns.clientId)).rejects.toThrow('no longer on this phone');
    await expect(queue.replace('ben', anns.clientId, payload())).rejects.toThrow('no longer on this phone');
    await expect(queue.markRefused('ben', anns.clientId, 'no', [])).rejects.toThrow('no longer on this phone');
    expect((await queue.get('ann', anns.clientId))?.state).toBe('waiting');
  });

  it('refuses a second entry under a device id already waiting', async () => {
    const queue = freshQueue();
    const saved = payload();
    await queue.add('ann', saved);
    await expect(queue.add('ann', { ...saved, notes: 'again' })).rejects.toThrow('already waiting');
    expect(await queue.list('ann')).toHaveLength(1);
  });

  it('marks a refusal with its reason and lets a fix wait again under the same clientId', async () => {
    const queue = freshQueue();
    const saved = payload();
    await queue.add('ann', saved);
    await queue.markRefused('ann', saved.clientId, 'The meter start is below the last reading.', [{ path: 'meterStart', message: 'Below 1204.' }]);
    const refused = await queue.get('ann', saved.clientId);
    expect(refused).toMatchObject({ state: 'refused', reason: 'The meter start is below the last reading.', attempts: 1 });
    expect(refused?.issues).toEqual([{ path: 'meterStart', message: 'Below 1204.' }]);

    const fixed = await queue.replace('ann', saved.clientId, { ...saved, clientId: 'ignored-another-id', meterStart: '1204', meterEnd: '1206' });
    expect(fixed).toMatchObject({ state: 'waiting', reason: null, issues: [], clientId: saved.clientId });
    expect(fixed.payload.clientId).toBe(saved.clientId);
    expect(fixed.payload.meterStart).toBe('1204');
    expect(fixed.queuedAt).toBe(refused?.queuedAt);
  });

  it('notes why a try did not get through without changing the entry', async () => {
    const queue = freshQueue();
    const saved = payload();
    await queue.add('ann', saved);
    await queue.markUndelivered('ann', saved.clientId, 'No signal.');
    expect(await queue.get('ann', saved.clientId)).toMatchObject({ state: 'waiting', reason: 'No signal.', attempts: 1, payload: saved });
  });

  it('removes an entry for good', async () => {
    const queue = freshQueue();
    const saved = payload();
    await queue.add('ann', saved);
    await queue.remove('ann', saved.clientId);
    expect(await queue.list('ann')).toEqual([]);
    await expect(queue.remove('ann', saved.clientId)).rejects.toThrow('no longer on this phone');
  });
});
