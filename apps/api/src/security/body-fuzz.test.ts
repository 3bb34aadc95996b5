import fc from 'fast-check';
import { invoices } from '@hitchbook/db';
import type { Role } from '@hitchbook/shared/roles';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addEntry, addNeighbourSheet, createBillingWorld } from '../modules/invoices/billing-world.fixture.js';
import { createOperation, signInAll, type OperationFixture } from '../test-support/fixtures.js';
import { createTestApp, type TestApp } from '../test-support/test-app.js';
import { hostileBodyFor, hostileQueryFor, type FuzzContext } from './hostile-json.js';
import { listRoutesWithSchemas, listWriteRoutes, type WriteRoute } from './route-bodies.js';

/**
 * Property-based fuzzing of every write route the application declares, so a new route is fuzzed
 * without being listed here. Seeded: a failure prints the seed and path that reproduce it; set
 * FUZZ_SEED / FUZZ_RUNS to explore further.
 */
const SEED = Number(process.env.FUZZ_SEED ?? 20261202);
const RUNS = Number(process.env.FUZZ_RUNS ?? 8);
const QUERY_RUNS = Math.max(1, Math.round(RUNS / 2));

/** What must never reach a caller in a refusal: stack frames, file paths, SQL or driver wording (a 2xx may echo the caller's own text). */
const LEAK = /\bat [\w.<>]+ \(|node_modules|\/src\/|\.[jt]s:\d+|\bSELECT\b|\bINSERT INTO\b|\bUPDATE \w+ SET\b|violates|syntax error|duplicate key|TypeError|ReferenceError|RangeError/i;

let t: TestApp;
let fx: OperationFixture;
let tokens: Record<string, string>;
let ctx: FuzzContext;
let params: Record<string, string>;
let protoBefore: string[];

beforeAll(async () => {
  protoBefore = Object.getOwnPropertyNames(Object.prototype).sort();
  t = await createTestApp();
  fx = await createOperation(t.dbh.db, 'Fuzz outfit');
  const world = await createBillingWorld(t.dbh.db, fx);
  const sheet = await addNeighbourSheet(t.dbh.db, world);
  const base = { workTypeId: world.workTypes.mowing, fieldId: world.fields.creekBottom, billToPartyId: fx.customers[0], hours: '2.50', acres: '30.000' };
  const draftEntry = await addEntry(t.dbh.db, world, { ...base, workDate: '2025-06-02', state: 'draft' });
  const approvedEntry = await addEntry(t.dbh.db, world, { ...base, workDate: '2025-06-03' });
  const [draft] = await t.dbh.db.insert(invoices).values({ operationId: fx.operationId, partyId: fx.customers[0], status: 'draft' }).returning({ id: invoices.id });
  params = {
    'machines:id': world.machines.tractor,
    'fields:id': world.fields.creekBottom,
    'parties:id': fx.customers[0],
    'work-types:id': world.workTypes.hauling,
    'users:membershipId': fx.members.operator.membershipId,
    'rate-sheets:id': sheet,
    'work-entries:id': draftEntry,
    'invoices:id': draft!.id,
  };
  ctx = {
    ids: [
      ...Object.values(params),
      approvedEntry,
      world.machines.mower,
      world.fields.schoolhouse,
      world.fields.ditch,
      world.workTypes.mowing,
      ...fx.households,
      ...fx.customers,
      fx.members.partner.membershipId,
    ],
  };
  tokens = await signInAll(t, fx);
});

afterAll(() => t?.close());

const ZERO = '00000000-0000-4000-8000-000000000000';

function pathFor(route: WriteRoute): string {
  const resource = route.path.split('/')[2]!;
  return route.path.replace(/:([a-zA-Z]+)/g, (_m, name: string) => params[`${resource}:${name}`] ?? ZERO);
}

function tokenFor(route: WriteRoute): string | null {
  if (route.isPublic) return null;
  const role: Role | undefined = route.roles?.includes('owner') ? 'owner' : route.roles?.[0];
  return role ? (tokens[role] ?? null) : null;
}

describe('fuzzed write-route bodies', () => {
  it('finds the write routes and the schemas of their bodies', () => {
    const routes = listWriteRoutes(t.app);
    expect(routes.length).toBeGreaterThan(30);
    expect(routes.filter((r) => r.bodySchema).length).toBeGreaterThan(20);
    expect(routes.find((r) => r.method === 'POST' && r.path === '/api/parties')?.bodySchema).not.toBeNull();
  });

  it('never answers 5xx or leaks internals, whatever JSON arrives', async () => {
    // Deletions last, so every other route still finds the rows it is pointed at.
    const routes = listWriteRoutes(t.app).sort((a, b) => Number(a.method === 'DELETE') - Number(b.method === 'DELETE'));
    const failures: string[] = [];
    const statuses: Record<string, Record<number, number>> = {};
    for (const [i, route] of routes.entries()) {
      const path = pathFor(route);
      const started = Date.now();
      const token = tokenFor(route);
      await fc.assert(
        fc.asyncProperty(hostileBodyFor(route.bodySchema, ctx), async (body) => {
          let req = t.http()[route.method.toLowerCase() as 'post' | 'put' | 'patch' | 'delete'](path).set('Content-Type', 'application/json');
          if (token) req = req.set('Authorization', `Bearer ${token}`);
          const res = await req.send(body);
          const text = res.text ?? '';
          const seen = (statuses[`${route.method} ${route.path}`] ??= {});
          seen[res.status] = (seen[res.status] ?? 0) + 1;
          // Without Stripe settings the card routes say so with a 503 by design; everything else is a bug.
          const unconfigured = res.status === 503 && t.config.stripe === null && (route.path.includes('/payments/') || route.path.endsWith('/checkout'));
          if ((res.status >= 500 && !unconfigured) || (res.status >= 400 && LEAK.test(text))) {
            failures.push(`${route.method} ${route.path} (seed ${SEED + i}) answered ${res.status} ${text.slice(0, 300)} to ${body.slice(0, 300)}`);
            return false;
          }
          return true;
        }),
        { seed: SEED + i, numRuns: RUNS, endOnFailure: true },
      ).catch(() => undefined);
      (statuses[`${route.method} ${route.path}`] ??= {})[0] = Date.now() - started;
    }
    // FUZZ_REPORT=1 shows how deep the bodies got (a route that never answers 2xx is only fuzzing its
    // validation) and, under "0", the milliseconds each route took.
    if (process.env.FUZZ_REPORT) console.log(Object.entries(statuses).map(([r, s]) => `${r} ${JSON.stringify(s)}`).join('\n'));
    expect(failures).toEqual([]);
  }, 600_000);

  it('never answers 5xx or leaks internals, whatever query string arrives', async () => {
    const routes = listRoutesWithSchemas(t.app).filter((r) => r.method === 'GET' && r.querySchema);
    expect(routes.length).toBeGreaterThan(10);
    const failures: string[] = [];
    for (const [i, route] of routes.entries()) {
      const path = pathFor(route);
      const token = tokenFor(route);
      await fc.assert(
        fc.asyncProperty(hostileQueryFor(route.querySchema!, ctx), async (query) => {
          const search = new URLSearchParams();
          for (const [k, v] of Object.entries(query)) {
            for (const one of Array.isArray(v) ? v : [v]) {
              if (one !== undefined) search.append(k, typeof one === 'string' ? one : JSON.stringify(one) ?? '');
            }
          }
          let req = t.http().get(`${path}?${search.toString()}`);
          if (token) req = req.set('Authorization', `Bearer ${token}`);
          const res = await req.buffer(true);
          const text = res.text ?? '';
          if (res.status >= 500 || (res.status >= 400 && LEAK.test(text.slice(0, 2000)))) {
            failures.push(`GET ${route.path} (seed ${SEED + i}) answered ${res.status} ${text.slice(0, 300)} to ?${search.toString().slice(0, 300)}`);
            return false;
          }
          return true;
        }),
        { seed: SEED + i, numRuns: QUERY_RUNS, endOnFailure: true },
      ).catch(() => undefined);
    }
    expect(failures).toEqual([]);
  }, 600_000);

  it('leaves no prototype polluted', () => {
    expect(Object.getOwnPropertyNames(Object.prototype).sort()).toEqual(protoBefore);
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
    expect(([] as unknown as Record<string, unknown>).polluted).toBeUndefined();
    expect(Object.prototype.toString.call({})).toBe('[object Object]');
  });
});
