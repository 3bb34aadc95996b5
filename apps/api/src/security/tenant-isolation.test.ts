import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { listRoutes, type RouteInfo } from '../common/auth/route-inventory.js';
import { createTestApp, type TestApp } from '../test-support/test-app.js';
import { ROWS } from './route-table.js';
import { bearer, createSecurityWorld, UNREACHABLE_STRIPE, type SecurityWorld } from './security-world.fixture.js';

/** Every table that holds an operation's rows: their content is fingerprinted before and after the sweep. */
const TENANT_TABLES = [
  'audit_log',
  'checkout_sessions',
  'cost_entries',
  'fields',
  'invoice_entries',
  'invoice_lines',
  'invoices',
  'machine_rates',
  'machine_shares',
  'machines',
  'memberships',
  'meter_readings',
  'parties',
  'payments',
  'rate_sheet_lines',
  'rate_sheets',
  'square_up_transfers',
  'square_ups',
  'uploads',
  'work_entries',
  'work_types',
] as const;

/**
 * Bodies that would pass validation, so a call with another operation's id in its path reaches the
 * lookup that must not find it (a probe body would stop at validation and prove nothing).
 */
const VALID_BODIES: Record<string, (a: SecurityWorld) => object> = {
  'PATCH /api/users/:membershipId': () => ({ role: 'operator' }),
  'PATCH /api/parties/:id': () => ({ name: 'Renamed by a stranger' }),
  'PATCH /api/machines/:id': () => ({ name: 'Renamed by a stranger' }),
  'POST /api/machines/:id/costs': (a) => ({ category: 'fuel', incurredOn: '2025-06-01', amount: '10.00', gallons: '3.000', paidByPartyId: a.fx.households[0] }),
  'PATCH /api/machines/:id/costs/:costId': () => ({ amount: '1.00' }),
  'PUT /api/machines/:id/shares': (a) => ({ effectiveFrom: '2025-09-01', shares: [{ partyId: a.fx.households[0], sharePct: '100' }] }),
  'POST /api/machines/:id/meter-readings': () => ({ hours: '1300.0' }),
  'PATCH /api/fields/:id': () => ({ name: 'Renamed by a stranger' }),
  'PATCH /api/work-types/:id': () => ({ name: 'Renamed by a stranger' }),
  'PATCH /api/work-entries/:id': () => ({ version: 1, notes: 'Changed by a stranger' }),
  'POST /api/work-entries/:id/submit': () => ({}),
  'POST /api/work-entries/:id/approve': () => ({}),
  'POST /api/work-entries/:id/reopen': () => ({}),
  'PATCH /api/rate-sheets/:id': () => ({ travelFlat: '1.00' }),
  'PATCH /api/invoices/:id': () => ({ version: 1, notes: 'Changed by a stranger' }),
  'POST /api/invoices/:id/issue': () => ({}),
  'POST /api/invoices/:id/void': () => ({ reason: 'A stranger says so' }),
  'POST /api/invoices/:id/credit-notes': () => ({ reason: 'A stranger says so' }),
  'POST /api/invoices/:id/send': () => ({}),
  'POST /api/invoices/:id/payments': () => ({ method: 'cash', amount: '1.00', receivedOn: '2025-06-01' }),
  'POST /api/invoices/:id/checkout': () => ({}),
  'POST /api/invoices/:id/payments/:paymentId/refund': () => ({ amount: '1.00' }),
  'POST /api/square-ups/:id/transfers/:transferId/paid': () => ({ paidOn: '2025-06-01', method: 'cash' }),
};

let t: TestApp;
let a: SecurityWorld;
let b: SecurityWorld;
const key = (r: { method: string; path: string }) => `${r.method} ${r.path}`;

beforeAll(async () => {
  t = await createTestApp({ stripe: UNREACHABLE_STRIPE });
  a = await createSecurityWorld(t, 'Tenant A');
  b = await createSecurityWorld(t, 'Tenant B');
}, 90_000);
afterAll(() => t.close());

/** A digest of every row operation B holds: any insert, update or delete changes it. */
async function fingerprint(operationId: string): Promise<Record<string, string>> {
  const out: Record<string, string> = {};
  for (const table of TENANT_TABLES) {
    const { rows } = await t.dbh.pool.query<{ n: string; digest: string | null }>(
      `select count(*)::text as n, md5(string_agg(t::text, '|' order by t::text)) as digest from ${table} t where operation_id = $1`,
      [operationId],
    );
    out[table] = `${rows[0]!.n}:${rows[0]!.digest ?? '-'}`;
  }
  return out;
}

/** The first role the route serves: the member of A who could make this call in their own operation. */
function callerFor(route: RouteInfo) {
  const row = ROWS[key(route)];
  if (!row || row.allow === 'public') return null;
  return row.allow.includes('owner') ? 'owner' : row.allow[0]!;
}

describe('tenant isolation', () => {
  it("answers 404 to every route given another operation's ids in its path, and changes nothing there", { timeout: 120_000 }, async () => {
    const withIds = listRoutes(t.app).filter((r) => r.path.includes('/:') && !r.isPublic);
    expect(withIds.length).toBeGreaterThan(30);
    // B's throwaway rows are made first, so the fingerprint already holds them.
    const paths = new Map<string, string>();
    for (const route of withIds) {
      const caller = callerFor(route);
      if (!caller) throw new Error(`${key(route)} has no row in the route table`);
      paths.set(key(route), await ROWS[key(route)]!.path(b, caller));
    }
    const before = await fingerprint(b.fx.operationId);
    const wrong: string[] = [];
    for (const route of withIds) {
      const caller = callerFor(route)!;
      const method = route.method.toLowerCase() as 'get' | 'post' | 'patch' | 'put' | 'delete';
      const req = t.http()[method](paths.get(key(route))!).set(bearer(a.tokens[caller])).set('X-Tenant-Id', b.fx.operationId);
      const res = method === 'get' || method === 'delete' ? await req : await req.send(VALID_BODIES[key(route)]?.(a) ?? {});
      if (res.status !== 404) wrong.push(`${key(route)} as A's ${caller}: ${res.status} ${JSON.stringify(res.body).slice(0, 160)}`);
    }
    expect(wrong).toEqual([]);
    expect(await fingerprint(b.fx.operationId)).toEqual(before);
  });

  it('has a valid body ready for every write route that takes an id', () => {
    const writes = listRoutes(t.app).filter((r) => r.path.includes('/:') && !r.isPublic && !['GET', 'DELETE'].includes(r.method));
    const bodiless = new Set(['POST /api/square-ups/:id/close', 'POST /api/work-entries/:id/photos']);
    expect(writes.map(key).filter((k) => !(k in VALID_BODIES) && !bodiless.has(k))).toEqual([]);
  });

  it("refuses another operation's ids inside a body and links nothing across", async () => {
    const before = await fingerprint(b.fx.operationId);
    const owner = bearer(a.tokens.owner);
    const entryCountBefore = (await fingerprint(a.fx.operationId)).work_entries;
    const calls = [
      t.http().post('/api/invoices/drafts').set(owner).send({ partyId: b.ids.party, from: '2025-01-01', to: '2025-12-31' }),
      t.http().post('/api/work-entries').set(owner).send({ workDate: '2025-06-02', fieldId: b.ids.field, workTypeId: a.ids.workType, hours: '1.00', billToPartyId: a.ids.party }),
      t.http().post('/api/work-entries').set(owner).send({ workDate: '2025-06-02', fieldId: a.ids.field, workTypeId: b.ids.workType, hours: '1.00', billToPartyId: a.ids.party }),
      t.http().post('/api/work-entries').set(owner).send({ workDate: '2025-06-02', fieldId: a.ids.field, workTypeId: a.ids.workType, powerMachineId: b.ids.machine, hours: '1.00', billToPartyId: a.ids.party }),
      t.http().post('/api/work-entries').set(owner).send({ workDate: '2025-06-02', fieldId: a.ids.field, workTypeId: a.ids.workType, hours: '1.00', billToPartyId: b.ids.party }),
      t.http().put(`/api/machines/${a.ids.machine}/shares`).set(owner).send({ effectiveFrom: '2025-09-01', shares: [{ partyId: b.fx.households[0], sharePct: '100' }] }),
      t.http().post(`/api/machines/${a.ids.machine}/costs`).set(owner).send({ category: 'repair', incurredOn: '2025-06-01', amount: '10.00', paidByPartyId: b.fx.households[0] }),
      t.http().post(`/api/machines/${a.ids.machine}/costs`).set(owner).send({ category: 'repair', incurredOn: '2025-06-01', amount: '10.00', paidByPartyId: a.fx.households[0], receiptUploadId: b.ids.upload }),
      t.http().patch(`/api/users/${a.fx.members.customer.membershipId}`).set(owner).send({ partyId: b.ids.party }),
    ];
    for (const [i, call] of calls.entries()) {
      const res = await call;
      expect([400, 404], `body ref ${i}: ${res.status} ${JSON.stringify(res.body).slice(0, 160)}`).toContain(res.status);
    }
    expect((await fingerprint(a.fx.operationId)).work_entries).toBe(entryCountBefore);
    expect(await fingerprint(b.fx.operationId)).toEqual(before);
  });

  it("finds nothing of another operation through query filters, and ignores tenant headers and parameters", async () => {
    const owner = bearer(a.tokens.owner);
    for (const path of [
      `/api/work-entries?fieldId=${b.ids.field}`,
      `/api/work-entries?machineId=${b.ids.machine}`,
      `/api/work-entries?billToPartyId=${b.ids.party}`,
      `/api/invoices?partyId=${b.ids.party}`,
      `/api/audit?entityId=${b.ids.invoice}`,
      `/api/audit?actorUserId=${b.fx.members.owner.userId}`,
    ]) {
      const res = await t.http().get(path).set(owner);
      expect(res.status, path).toBe(200);
      expect(res.body.total, path).toBe(0);
    }
    expect((await t.http().get(`/api/rate-sheets/in-force?partyId=${b.ids.party}&date=2025-05-01`).set(owner)).status).toBe(404);
    // A tenant named in a header changes nothing; one named in the query is an unknown field.
    const mine = await t.http().get('/api/machines').set(owner).set('X-Tenant-Id', b.fx.operationId).set('X-Operation-Id', b.fx.operationId);
    expect(mine.status).toBe(200);
    expect(mine.body.items.map((m: { id: string }) => m.id)).toContain(a.ids.machine);
    expect(mine.body.items.map((m: { id: string }) => m.id)).not.toContain(b.ids.machine);
    for (const param of ['tenantId', 'operationId']) {
      expect((await t.http().get(`/api/machines?${param}=${b.fx.operationId}`).set(owner)).status, param).toBe(400);
    }
  });
});
