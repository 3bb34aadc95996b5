import { and, eq } from 'drizzle-orm';
import { auditLog } from '@hitchbook/db';
import type { AuditEntryDto } from '@hitchbook/shared/schemas/audit';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bearer, createSecurityWorld, throwaway, type SecurityWorld } from '../../security/security-world.fixture.js';
import { createTestApp, type TestApp } from '../../test-support/test-app.js';

let t: TestApp;
let w: SecurityWorld;

beforeAll(async () => {
  t = await createTestApp();
  w = await createSecurityWorld(t, 'Audit');
}, 60_000);
afterAll(() => t.close());

async function readLog(query: string, token = w.tokens.owner): Promise<{ items: AuditEntryDto[]; total: number }> {
  const res = await t.http().get(`/api/audit${query}`).set(bearer(token));
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body;
}

describe('the audit log records every money and access change', () => {
  it('names entries, rates, invoices, payments, shares and role changes with who made them', async () => {
    const owner = bearer(w.tokens.owner);
    const partner = bearer(w.tokens.partner);
    const ok = (res: { status: number; body: unknown }) => expect(res.status, JSON.stringify(res.body)).toBeLessThan(300);
    ok(await t.http().post(`/api/work-entries/${w.ids.entry}/approve`).set(partner).send({}));
    ok(await t.http().patch(`/api/rate-sheets/${w.ids.rateSheet}`).set(owner).send({ travelFlat: '30.00' }));
    ok(await t.http().post(`/api/invoices/${w.ids.invoice}/payments`).set(owner).send({ method: 'cheque', amount: '50.00', receivedOn: '2025-06-10', reference: 'Cheque 311' }));
    ok(await t.http().put(`/api/machines/${w.ids.machine}/shares`).set(partner).send({ effectiveFrom: '2025-07-01', shares: [{ partyId: w.fx.households[0], sharePct: '40' }, { partyId: w.fx.households[1], sharePct: '60' }] }));
    const promoted = await throwaway.membership(w);
    ok(await t.http().patch(`/api/users/${promoted}`).set(owner).send({ role: 'bookkeeper' }));
    ok(await t.http().delete(`/api/users/${await throwaway.membership(w)}`).set(owner));

    const { items } = await readLog('?pageSize=200');
    const find = (action: string, entityId?: string) => items.find((e) => e.action === action && (!entityId || e.entityId === entityId));
    const expectations: Array<[string, string | undefined, string]> = [
      ['work-entry.approved', w.ids.entry, w.fx.members.partner.userId],
      ['rate-sheet.updated', w.ids.rateSheet, w.fx.members.owner.userId],
      ['invoice.drafted', w.ids.invoice, w.fx.members.owner.userId],
      ['invoice.issued', w.ids.invoice, w.fx.members.owner.userId],
      ['payment.recorded', w.ids.invoice, w.fx.members.owner.userId],
      ['machine.shares-set', w.ids.machine, w.fx.members.partner.userId],
      ['membership.updated', promoted, w.fx.members.owner.userId],
      ['membership.removed', undefined, w.fx.members.owner.userId],
      ['square-up.closed', w.ids.squareUp, w.fx.members.owner.userId],
    ];
    for (const [action, entityId, actor] of expectations) {
      const entry = find(action, entityId);
      expect(entry, action).toBeDefined();
      expect(entry!.actor?.userId, action).toBe(actor);
    }
    expect(find('work-entry.approved', w.ids.entry)!.changes).toContainEqual({ field: 'state', before: 'submitted', after: 'approved' });
    expect(find('rate-sheet.updated', w.ids.rateSheet)!.changes).toContainEqual(expect.objectContaining({ field: 'travelFlat', after: '30.00' }));
    expect(find('membership.updated')!.changes).toContainEqual({ field: 'role', before: 'operator', after: 'bookkeeper' });
  });
});

describe('GET /api/audit', () => {
  it('lists newest first, in pages, with a total', async () => {
    const all = await readLog('?pageSize=200');
    // Signing in changes nothing: the world's members all signed in, and none of it is listed.
    expect(all.items.filter((e) => e.action.startsWith('auth.'))).toEqual([]);
    const times = all.items.map((e) => e.at);
    expect(times).toEqual([...times].sort().reverse());
    const second = await readLog('?pageSize=2&page=2');
    expect(second.total).toBe(all.total);
    expect(second.items.map((e) => e.id)).toEqual(all.items.slice(2, 4).map((e) => e.id));
  });

  it('filters by kind of record, by who made the change and by day', async () => {
    const invoices = await readLog('?entityType=invoice&pageSize=200');
    expect(invoices.items.length).toBeGreaterThan(0);
    expect(new Set(invoices.items.map((e) => e.entityType))).toEqual(new Set(['invoice']));

    const byPartner = await readLog(`?actorUserId=${w.fx.members.partner.userId}&pageSize=200`);
    expect(byPartner.items.length).toBeGreaterThan(0);
    expect(new Set(byPartner.items.map((e) => e.actor?.userId))).toEqual(new Set([w.fx.members.partner.userId]));

    // One row moved into a past day: the day filter finds it alone.
    const [moved] = await t.dbh.db
      .update(auditLog)
      .set({ createdAt: new Date('2024-03-15T12:00:00Z') })
      .where(and(eq(auditLog.operationId, w.fx.operationId), eq(auditLog.action, 'invoice.drafted'), eq(auditLog.entityId, w.ids.draftInvoice)))
      .returning({ id: auditLog.id });
    const day = await readLog('?from=2024-03-15&to=2024-03-15');
    expect(day.items.map((e) => e.id)).toEqual([moved!.id]);
    expect((await readLog('?from=2024-03-16&to=2024-03-20')).total).toBe(0);
    expect((await readLog('?from=2024-03-14&to=2024-03-14')).total).toBe(0);
  });

  it('refuses filters it does not know, and dates the wrong way round', async () => {
    for (const query of ['?entityType=passwords', '?actorUserId=someone', '?from=2025-05-02&to=2025-05-01', '?operationId=x', '?pageSize=1000']) {
      const res = await t.http().get(`/api/audit${query}`).set(bearer(w.tokens.owner));
      expect(res.status, query).toBe(400);
    }
  });

  it('is the owner and the bookkeeper’s alone', async () => {
    expect((await readLog('', w.tokens.bookkeeper)).total).toBeGreaterThan(0);
    for (const role of ['partner', 'operator', 'customer'] as const) {
      expect((await t.http().get('/api/audit').set(bearer(w.tokens[role]))).status, role).toBe(403);
    }
    expect((await t.http().get('/api/audit')).status).toBe(401);
  });

  it("shows one operation's log only, whatever the query names", async () => {
    const other = await createSecurityWorld(t, 'Audit elsewhere');
    const mine = await readLog('?pageSize=200');
    const theirs = await readLog('?pageSize=200', other.tokens.owner);
    const theirIds = new Set(theirs.items.map((e) => e.id));
    expect(mine.items.some((e) => theirIds.has(e.id))).toBe(false);
    const probe = await readLog(`?entityId=${other.ids.invoice}`);
    expect(probe.total).toBe(0);
    expect((await readLog(`?actorUserId=${other.fx.members.owner.userId}`)).total).toBe(0);
  });
});
