import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../../test-support/test-app.js';
import { listRoutes } from './route-inventory.js';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

/** The only routes an anonymous caller may reach; adding one here is a security decision. */
const PUBLIC_ROUTES = [
  'GET /api/auth/invitations/:token',
  'GET /api/health',
  'POST /api/auth/invitations/accept',
  'POST /api/auth/login',
  'POST /api/auth/logout',
  'POST /api/auth/password-reset/confirm',
  'POST /api/auth/password-reset/request',
  'POST /api/auth/refresh',
  'POST /api/payments/stripe-webhook',
];

describe('route access declarations', () => {
  it('finds the application routes', () => {
    const routes = listRoutes(t.app);
    expect(routes.length).toBeGreaterThan(10);
    expect(routes.map((r) => `${r.method} ${r.path}`)).toContain('GET /api/auth/me');
  });

  it('has every route declare @Public() or a non-empty @Roles()', () => {
    const undeclared = listRoutes(t.app)
      .filter((r) => !r.isPublic && (!r.roles || r.roles.length === 0))
      .map((r) => `${r.method} ${r.path} (${r.controller}.${r.handler})`);
    expect(undeclared).toEqual([]);
  });

  it('opens only the listed routes to anonymous callers', () => {
    const open = listRoutes(t.app)
      .filter((r) => r.isPublic)
      .map((r) => `${r.method} ${r.path}`)
      .sort();
    expect(open).toEqual([...PUBLIC_ROUTES].sort());
  });

  it('answers 401 to an anonymous call on every non-public route', async () => {
    for (const route of listRoutes(t.app).filter((r) => !r.isPublic)) {
      const path = route.path.replace(/:[a-zA-Z]+/g, '00000000-0000-4000-8000-000000000000');
      const res = await t.http()[route.method.toLowerCase() as 'get' | 'post' | 'patch' | 'put' | 'delete'](path).send({});
      expect(res.status, `${route.method} ${route.path}`).toBe(401);
    }
  });
});
