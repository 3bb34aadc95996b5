import { count, eq } from 'drizzle-orm';
import { auditLog, invoices } from '@hitchbook/db';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { listRoutes, type RouteInfo } from '../common/auth/route-inventory.js';
import { createTestApp, type TestApp } from '../test-support/test-app.js';
import { EVERYONE, PROBE, ROWS, type Row } from './route-table.js';
import { bearer, CALLERS, createSecurityWorld, UNREACHABLE_STRIPE, type Caller, type SecurityWorld } from './security-world.fixture.js';

/**
 * Non-GET routes a bookkeeper may call although bookkeepers change nothing: calculators that store
 * nothing (agreed API, "Estimates: pure computations") and their own password. Every other write is 403.
 */
const BOOKKEEPER_NON_WRITES = new Set([
  'POST /api/estimates/machine-cost',
  'POST /api/estimates/field-capacity',
  'POST /api/estimates/break-even',
  'POST /api/estimates/joint-ownership',
  'POST /api/auth/password',
]);

/** Field names that carry money: an operator's responses must contain none of them. */
const MONEY_KEY = /price|amount|rate|cost|wage|balance|income|charge|fee|salvage|paid|owed|profit|subtotal|vat|tax/i;
/** Money already formatted for show ("$1,234.50"), and charts drawn in dollars. */
const MONEY_TEXT = /^-?\$|\bUSD\b/;

let t: TestApp;
let w: SecurityWorld;
let routes: RouteInfo[];
const key = (r: { method: string; path: string }) => `${r.method} ${r.path}`;

beforeAll(async () => {
  t = await createTestApp({ stripe: UNREACHABLE_STRIPE });
  w = await createSecurityWorld(t, 'Matrix');
  routes = listRoutes(t.app);
}, 60_000);
afterAll(() => t.close());

async function call(route: RouteInfo, caller: Caller, path: string) {
  const method = route.method.toLowerCase() as 'get' | 'post' | 'patch' | 'put' | 'delete';
  let req = t.http()[method](path);
  if (caller !== 'anonymous') req = req.set(bearer(w.tokens[caller]));
  return method === 'get' ? req : req.send(PROBE);
}

function expected(row: Row, caller: Caller): number {
  if (row.allow === 'public') return row.ok;
  if (caller === 'anonymous') return 401;
  return row.allow.includes(caller) ? (row.okFor?.[caller] ?? row.ok) : 403;
}

function moneyIn(value: unknown, at = ''): string[] {
  if (typeof value === 'string') return MONEY_TEXT.test(value) ? [`${at} = ${value}`] : [];
  if (Array.isArray(value)) return value.flatMap((v, i) => moneyIn(v, `${at}[${i}]`));
  if (value && typeof value === 'object') {
    if ((value as { unit?: unknown }).unit === 'usd') return [`${at} in usd`];
    return Object.entries(value).flatMap(([k, v]) => [...(MONEY_KEY.test(k) ? [`${at}.${k}`] : []), ...moneyIn(v, `${at}.${k}`)]);
  }
  return [];
}

describe('authorisation matrix', () => {
  it('has exactly one row for every route the application serves', () => {
    const served = routes.map(key);
    expect(served.filter((k) => !(k in ROWS)), 'routes without a row in the matrix').toEqual([]);
    expect(Object.keys(ROWS).filter((k) => !served.includes(k)), 'rows for routes that no longer exist').toEqual([]);
  });

  it('gives every caller the expected status on every route, and the refused calls change nothing', async () => {
    const auditRows = async () => (await t.dbh.db.select({ n: count() }).from(auditLog).where(eq(auditLog.operationId, w.fx.operationId)))[0]!.n;
    const before = { audit: await auditRows(), invoices: await t.dbh.db.select({ id: invoices.id, status: invoices.status, sentAt: invoices.sentAt }).from(invoices).where(eq(invoices.operationId, w.fx.operationId)) };
    const wrong: string[] = [];
    // Refused calls first, so the rows they name are untouched when the allowed calls run.
    for (const refused of [true, false]) {
      for (const route of routes) {
        const row = ROWS[key(route)];
        if (!row) continue;
        for (const caller of CALLERS) {
          const want = expected(row, caller);
          const isRefused = row.allow !== 'public' && (want === 401 || want === 403);
          if (isRefused !== refused) continue;
          const res = await call(route, caller, await row.path(w, caller));
          if (res.status !== want) wrong.push(`${key(route)} as ${caller}: ${res.status}, expected ${want} ${res.status >= 400 ? JSON.stringify(res.body).slice(0, 160) : ''}`);
        }
      }
      if (refused) {
        expect(await auditRows(), 'audit rows after refused calls').toBe(before.audit);
        const now = await t.dbh.db.select({ id: invoices.id, status: invoices.status, sentAt: invoices.sentAt }).from(invoices).where(eq(invoices.operationId, w.fx.operationId));
        expect(now).toEqual(before.invoices);
      }
    }
    expect(wrong).toEqual([]);
  }, 180_000);

  it('lets an allowed caller reach every non-public route: never 401 or 403', () => {
    for (const [k, row] of Object.entries(ROWS)) {
      if (row.allow === 'public') continue;
      expect(row.allow.length, k).toBeGreaterThan(0);
      expect([401, 403], k).not.toContain(row.ok);
    }
  });

  it('lets the bookkeeper change nothing: every write route refuses them', () => {
    const writable = routes
      .filter((r) => r.method !== 'GET' && !r.isPublic && !BOOKKEEPER_NON_WRITES.has(key(r)))
      .filter((r) => expected(ROWS[key(r)] ?? { allow: EVERYONE, path: () => '', ok: 200 }, 'bookkeeper') !== 403)
      .map(key);
    expect(writable).toEqual([]);
  });

  it('lets the bookkeeper run the calculators without storing anything', async () => {
    const audit = async () => (await t.dbh.db.select({ n: count() }).from(auditLog).where(eq(auditLog.operationId, w.fx.operationId)))[0]!.n;
    const before = await audit();
    const res = await t.http().post('/api/estimates/field-capacity').set(bearer(w.tokens.bookkeeper)).send({ widthFt: '15', speedMph: '5', efficiencyPct: '80' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(await audit()).toBe(before);
  });

  it('shows an operator no money in any response it may read', async () => {
    const readable = routes.filter((r) => r.method === 'GET' && ROWS[key(r)] && ROWS[key(r)]!.allow !== 'public' && expected(ROWS[key(r)]!, 'operator') === 200);
    expect(readable.map(key)).toEqual(expect.arrayContaining(['GET /api/machines/:id', 'GET /api/work-entries', 'GET /api/dashboard']));
    const found: string[] = [];
    for (const route of readable) {
      const res = await call(route, 'operator', await ROWS[key(route)]!.path(w, 'operator'));
      expect(res.status, key(route)).toBe(200);
      if (res.type === 'application/json') found.push(...moneyIn(res.body).map((p) => `${key(route)} ${p}`));
      else if (res.type === 'text/csv') {
        const header = (res.text.split(/\r?\n/)[0] ?? '').split(',');
        expect(header.length, key(route)).toBeGreaterThan(1);
        found.push(...header.filter((h) => MONEY_KEY.test(h)).map((h) => `${key(route)} column ${h}`));
      } else if (res.type.startsWith('image/')) {
        // A photo someone took of the work: the file as it was uploaded, no figures from the books.
      } else throw new Error(`${key(route)} answers ${res.type}; say here how to look for money in it`);
    }
    expect(found).toEqual([]);
    // The same look finds money where it is shown: the owner's machine and home page.
    for (const path of [`/api/machines/${w.ids.machine}`, '/api/dashboard']) {
      expect(moneyIn((await t.http().get(path).set(bearer(w.tokens.owner))).body), path).not.toEqual([]);
    }
  });

  it('shows a customer only their own issued invoices and the entries on them', async () => {
    const list = await t.http().get('/api/invoices?pageSize=200').set(bearer(w.tokens.customer));
    expect(list.body.items.map((i: { id: string }) => i.id)).toEqual([w.ids.invoice]);
    const mine = await t.http().get(`/api/invoices/${w.ids.invoice}`).set(bearer(w.tokens.customer));
    expect(mine.body.entries.map((e: { id: string }) => e.id)).toEqual([w.ids.invoicedEntry]);
    for (const other of [w.ids.otherInvoice, w.ids.draftInvoice]) {
      expect((await t.http().get(`/api/invoices/${other}`).set(bearer(w.tokens.customer))).status).toBe(404);
    }
    // Everything else a customer may read names nothing outside their own invoice.
    const readable = routes.filter((r) => r.method === 'GET' && ROWS[key(r)] && ROWS[key(r)]!.allow !== 'public' && expected(ROWS[key(r)]!, 'customer') === 200);
    for (const route of readable) {
      const res = await call(route, 'customer', await ROWS[key(route)]!.path(w, 'customer'));
      const text = res.type === 'application/json' ? JSON.stringify(res.body) : '';
      for (const foreign of [w.ids.otherInvoice, w.ids.draftInvoice, w.ids.entry, w.ids.machine, w.fx.customers[1]]) {
        expect(text, `${key(route)} names ${foreign}`).not.toContain(foreign);
      }
    }
  });
});
