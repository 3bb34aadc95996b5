import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createOperation, signInAll, type OperationFixture } from '../../test-support/fixtures.js';
import { createTestApp, type TestApp } from '../../test-support/test-app.js';
import { Dec } from '@hitchbook/shared/decimal';
import type { Actor } from '../../common/auth/actor.js';
import { SharesRepository } from './shares.repository.js';
import { SharesService } from './shares.service.js';

let t: TestApp;
let fx: OperationFixture;
let other: OperationFixture;
let tokens: Awaited<ReturnType<typeof signInAll>>;
const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });

beforeAll(async () => {
  t = await createTestApp();
  fx = await createOperation(t.dbh.db);
  other = await createOperation(t.dbh.db, 'Elsewhere');
  tokens = await signInAll(t, fx);
});
afterAll(() => t.close());

async function newCombine(): Promise<string> {
  const res = await t.http().post('/api/machines').set(bearer(tokens.owner)).send({ name: `Combine ${Math.random()}`, classId: 'combine-sp', ptoHp: 300, listPrice: 450000 });
  return res.body.id as string;
}
const put = (machineId: string, body: object, token = tokens.owner) => t.http().put(`/api/machines/${machineId}/shares`).set(bearer(token)).send(body);
const [hA, hB] = [() => fx.households[0], () => fx.households[1]];

describe('ownership shares', () => {
  it('refuses sets adding up to 99.99 % or 100.01 %, naming shares and the actual sum, and stores nothing', async () => {
    const id = await newCombine();
    for (const [a, b, sum] of [['49.99', '50', '99.99'], ['50.01', '50', '100.01']] as const) {
      const res = await put(id, { effectiveFrom: '2025-01-01', shares: [{ partyId: hA(), sharePct: a }, { partyId: hB(), sharePct: b }] });
      expect(res.status).toBe(400);
      expect(res.body.issues).toEqual([{ path: 'shares', message: `Shares must add up to exactly 100 %; these add up to ${sum} %` }]);
    }
    expect(await t.dbh.db.query.machineShares.findMany({ where: (s, { eq }) => eq(s.machineId, id) })).toEqual([]);
  });

  it('keeps the history by effective date and answers which set was in force on a day', async () => {
    const id = await newCombine();
    expect((await put(id, { effectiveFrom: '2021-03-01', shares: [{ partyId: hA(), sharePct: 100 }] })).status).toBe(200);
    const changed = await put(id, { effectiveFrom: '2024-01-01', shares: [{ partyId: hA(), sharePct: '66.6667' }, { partyId: hB(), sharePct: '33.3333' }] });
    expect(changed.status).toBe(200);
    expect(changed.body.current.effectiveFrom).toBe('2024-01-01');
    expect(changed.body.current.shares.map((s: { partyId: string; sharePct: string }) => [s.partyId, s.sharePct])).toEqual([[hA(), '66.6667'], [hB(), '33.3333']]);
    expect(changed.body.history.map((s: { effectiveFrom: string }) => s.effectiveFrom)).toEqual(['2024-01-01', '2021-03-01']);

    const mid2023 = await t.http().get(`/api/machines/${id}/shares?on=2023-06-30`).set(bearer(tokens.operator));
    expect(mid2023.status).toBe(200);
    expect(mid2023.body.current).toMatchObject({ effectiveFrom: '2021-03-01', shares: [{ partyId: hA(), sharePct: '100.0000' }] });
    const dayOf = await t.http().get(`/api/machines/${id}/shares?on=2024-01-01`).set(bearer(tokens.bookkeeper));
    expect(dayOf.body.current.effectiveFrom).toBe('2024-01-01');
    const before = await t.http().get(`/api/machines/${id}/shares?on=2020-12-31`).set(bearer(tokens.owner));
    expect(before.body.current).toBeNull();

    const repo = t.app.get(SharesRepository);
    expect((await repo.inForceOn(fx.operationId, id, '2023-12-31')).map((s) => s.sharePct)).toEqual(['100.0000']);
    expect((await repo.inForceOn(fx.operationId, id, '2030-01-01')).map((s) => s.partyId)).toEqual([hA(), hB()]);
    expect(await repo.inForceOn(other.operationId, id, '2030-01-01')).toEqual([]);
  });

  it('replaces the set of the same effective date as a correction', async () => {
    const id = await newCombine();
    await put(id, { effectiveFrom: '2022-05-01', shares: [{ partyId: hA(), sharePct: 100 }] });
    const fixed = await put(id, { effectiveFrom: '2022-05-01', shares: [{ partyId: hA(), sharePct: 50 }, { partyId: hB(), sharePct: 50 }] });
    expect(fixed.body.history).toHaveLength(1);
    expect(fixed.body.history[0].shares).toHaveLength(2);
  });

  it('lets only households of the operation own, each once', async () => {
    const id = await newCombine();
    const res = await put(id, {
      effectiveFrom: '2025-01-01',
      shares: [{ partyId: fx.customers[0], sharePct: 25 }, { partyId: other.households[0], sharePct: 25 }, { partyId: hA(), sharePct: 25 }, { partyId: hA(), sharePct: 25 }],
    });
    expect(res.status).toBe(400);
    expect(res.body.issues.map((i: { path: string }) => i.path)).toEqual(['shares.3.partyId']);
    const kinds = await put(id, { effectiveFrom: '2025-01-01', shares: [{ partyId: fx.customers[0], sharePct: 50 }, { partyId: other.households[0], sharePct: 50 }] });
    expect(kinds.status).toBe(400);
    expect(kinds.body.issues).toEqual([
      { path: 'shares.0.partyId', message: expect.stringMatching(/customer; only households own machines/) },
      { path: 'shares.1.partyId', message: 'No such party.' },
    ]);
  });

  it('lets the bookkeeper and a partner without a share read but not change the owners', async () => {
    const id = await newCombine();
    await put(id, { effectiveFrom: '2020-01-01', shares: [{ partyId: hA(), sharePct: 100 }] });
    const body = { effectiveFrom: '2025-01-01', shares: [{ partyId: hB(), sharePct: 100 }] };
    expect((await put(id, body, tokens.bookkeeper)).status).toBe(403);
    expect((await put(id, body, tokens.partner)).status).toBe(403);
    expect((await put(id, body, tokens.operator)).status).toBe(403);
    expect((await t.http().get(`/api/machines/${id}/shares`).set(bearer(tokens.customer))).status).toBe(403);
    expect((await t.http().get(`/api/machines/${id}/shares`).set(bearer(tokens.partner))).body.history).toHaveLength(1);
  });

  it('makes a second writer of the same day wait, so two sets are never stored on top of each other', async () => {
    const id = await newCombine();
    const service = t.app.get(SharesService);
    const actor = { operationId: fx.operationId, userId: fx.members.owner.userId, role: 'owner' } as Actor;
    const lines = (partyId: string) => [{ partyId, sharePct: new Dec(100) }];
    let release!: () => void;
    const held = new Promise<void>((resolve) => (release = resolve));
    let secondDone = false;
    // The first writer keeps its transaction open; the second starts meanwhile.
    const first = t.dbh.db.transaction(async (tx) => {
      await service.writeSetOrThrow(tx, actor, id, '2025-02-01', lines(hA()), 'shares');
      await held;
    });
    await new Promise((r) => setTimeout(r, 100));
    const second = t.dbh.db
      .transaction((tx) => service.writeSetOrThrow(tx, actor, id, '2025-02-01', lines(hB()), 'shares'))
      .then(() => (secondDone = true));
    await new Promise((r) => setTimeout(r, 300));
    const secondFinishedEarly = secondDone;
    release();
    await Promise.all([first, second]);
    expect(secondFinishedEarly).toBe(false);
    const stored = await t.dbh.db.query.machineShares.findMany({ where: (s, { eq }) => eq(s.machineId, id) });
    expect(stored.map((s) => [s.partyId, s.sharePct])).toEqual([[hB(), '100.0000']]);
  });
});
