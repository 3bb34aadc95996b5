import { describe, expect, it } from 'vitest';
import { ApiError, createApiClient, createSessionStore, type Session } from './api';

const user = {
  id: 'u1',
  email: 'owner@example.test',
  name: 'Ada Owner',
  role: 'owner' as const,
  operationId: 'op1',
  operationName: 'Example Ridge Farms',
  partyId: null,
};

function json(status: number, body: unknown): Response {
  return new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });
}

interface Call {
  url: string;
  method: string;
  headers: Record<string, string>;
}

/** A fake server: `/api/auth/refresh` issues token `fresh-N`; other routes accept only the newest token. */
function fakeServer(opts: { refreshStatus?: number } = {}) {
  const calls: Call[] = [];
  let issued = 0;
  let refreshGate: () => void = () => {};
  const refreshHeld = new Promise<void>((resolve) => (refreshGate = resolve));
  const fetch = async (input: string | URL | Request, init?: RequestInit): Promise<Response> => {
    const url = String(input);
    const headers = (init?.headers ?? {}) as Record<string, string>;
    calls.push({ url, method: init?.method ?? 'GET', headers });
    if (url.endsWith('/api/auth/refresh')) {
      await refreshHeld;
      if (opts.refreshStatus) return json(opts.refreshStatus, { message: 'No session.' });
      issued += 1;
      return json(200, { accessToken: `fresh-${issued}`, expiresIn: 900, user });
    }
    if (headers.Authorization === `Bearer fresh-${issued}` && issued > 0) return json(200, { ok: url });
    return json(401, { message: 'Token expired.' });
  };
  return { fetch, calls, releaseRefresh: () => refreshGate() };
}

function expiredSession(): Session {
  return { accessToken: 'stale', expiresAt: 0, user };
}

describe('api client', () => {
  it('refreshes once when several requests get 401 at the same time, then retries each', async () => {
    const server = fakeServer();
    const sessionStore = createSessionStore();
    sessionStore.set(expiredSession());
    const client = createApiClient({ sessionStore, fetch: server.fetch });

    const pending = Promise.all([client.get('/api/a'), client.get('/api/b'), client.get('/api/c')]);
    await new Promise((resolve) => setTimeout(resolve, 10));
    server.releaseRefresh();
    const results = await pending;

    expect(server.calls.filter((c) => c.url.endsWith('/api/auth/refresh'))).toHaveLength(1);
    expect(results).toEqual([{ ok: '/api/a' }, { ok: '/api/b' }, { ok: '/api/c' }]);
    expect(sessionStore.get()?.accessToken).toBe('fresh-1');
  });

  it('sends the anti-forgery header and no bearer token to the refresh route', async () => {
    const server = fakeServer();
    server.releaseRefresh();
    const client = createApiClient({ sessionStore: createSessionStore(), fetch: server.fetch });

    await client.refreshSession();

    const refresh = server.calls.find((c) => c.url.endsWith('/api/auth/refresh'));
    expect(refresh?.headers['X-Requested-With']).toBe('hitchbook');
    expect(refresh?.headers.Authorization).toBeUndefined();
  });

  it('clears the session and rejects with 401 when the refresh is refused', async () => {
    const server = fakeServer({ refreshStatus: 401 });
    server.releaseRefresh();
    const sessionStore = createSessionStore();
    sessionStore.set(expiredSession());
    const client = createApiClient({ sessionStore, fetch: server.fetch });

    const error = await client.get('/api/dashboard').catch((e: unknown) => e);

    expect(error).toBeInstanceOf(ApiError);
    expect((error as ApiError).status).toBe(401);
    expect(sessionStore.get()).toBeNull();
  });

  it('does not try to refresh when the sign-in itself is refused', async () => {
    const calls: string[] = [];
    const client = createApiClient({
      sessionStore: createSessionStore(),
      fetch: async (input) => {
        calls.push(String(input));
        return json(401, { message: 'Wrong e-mail or password.' });
      },
    });

    const error = (await client.signIn('/api/auth/login', { email: 'a@b.test', password: 'x' }).catch((e) => e)) as ApiError;

    expect(error.message).toBe('Wrong e-mail or password.');
    expect(calls).toEqual(['/api/auth/login']);
  });

  it('keeps field issues with dotted paths from a 400 answer', async () => {
    const client = createApiClient({
      sessionStore: createSessionStore(),
      fetch: async () =>
        json(400, {
          message: 'Check the highlighted fields.',
          issues: [
            { path: 'listPrice', message: 'Must be positive.' },
            { path: ['members', 0, 'ownershipPct'], message: 'Too large.' },
          ],
        }),
    });

    const error = (await client.post('/api/estimates/machine-cost', {}).catch((e) => e)) as ApiError;

    expect(error.status).toBe(400);
    expect(error.issues).toEqual([
      { path: 'listPrice', message: 'Must be positive.' },
      { path: 'members.0.ownershipPct', message: 'Too large.' },
    ]);
  });

  it('names the database outage when the server answers 503 without a message', async () => {
    const client = createApiClient({
      sessionStore: createSessionStore(),
      fetch: async () => new Response('', { status: 503 }),
    });

    const error = (await client.get('/api/dashboard').catch((e) => e)) as ApiError;

    expect(error.status).toBe(503);
    expect(error.message).toMatch(/database/);
  });

  it('reports status 0 when the network is down', async () => {
    const client = createApiClient({
      sessionStore: createSessionStore(),
      fetch: async () => {
        throw new TypeError('Failed to fetch');
      },
    });

    const error = (await client.get('/api/health').catch((e) => e)) as ApiError;

    expect(error.status).toBe(0);
  });

  it('stores the session from the sign-in answer with its expiry', async () => {
    const sessionStore = createSessionStore();
    const client = createApiClient({
      sessionStore,
      now: () => 1_000,
      fetch: async () => json(200, { accessToken: 'tok', expiresIn: 60, user }),
    });

    await client.signIn('/api/auth/login', { email: user.email, password: 'pw' });

    expect(sessionStore.get()).toEqual({ accessToken: 'tok', expiresAt: 61_000, user });
  });
});
