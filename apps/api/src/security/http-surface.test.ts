import { request as httpRequest } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { JSON_BODY_LIMIT_BYTES as LIMIT_BYTES } from '../app.factory.js';
import { createOperation, signIn, type OperationFixture } from '../test-support/fixtures.js';
import { createTestApp, type TestApp } from '../test-support/test-app.js';

/** Headers, cross-origin rules and body limits as a browser or a hostile client meets them. */

let t: TestApp;
let port: number;
let fx: OperationFixture;
const CSRF = { 'X-Requested-With': 'hitchbook' };

beforeAll(async () => {
  t = await createTestApp();
  await t.app.listen(0, '127.0.0.1');
  port = (t.app.getHttpServer().address() as AddressInfo).port;
  fx = await createOperation(t.dbh.db, 'Surface outfit');
});
afterAll(() => t?.close());

function cspOf(headers: Record<string, unknown>): Map<string, string> {
  const csp = String(headers['content-security-policy'] ?? '');
  return new Map(csp.split(';').map((d) => d.trim().split(/\s+/)).filter((p) => p[0]).map(([name, ...values]) => [name!, values.join(' ')]));
}

interface Streamed {
  status: number;
  body: string;
  /** How much of the body had been written when the answer came. */
  sentBytes: number;
}

/** Streams `total` bytes of JSON in chunks, stopping as soon as the server answers. */
function streamJson(path: string, total: number, headers: Record<string, string> = {}): Promise<Streamed> {
  return new Promise((resolve, reject) => {
    let sentBytes = 0;
    let answered = false;
    const req = httpRequest({ host: '127.0.0.1', port, path, method: 'POST', headers: { 'Content-Type': 'application/json', ...headers } }, (res) => {
      answered = true;
      let body = '';
      res.on('data', (c: Buffer) => (body += c.toString()));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, body, sentBytes }));
    });
    req.on('error', (err) => (answered ? undefined : reject(err)));
    const chunk = Buffer.from(`"${'x'.repeat(64 * 1024 - 3)}",`);
    req.write('[');
    const pump = () => {
      while (!answered && sentBytes < total) {
        sentBytes += chunk.length;
        if (!req.write(chunk)) return void req.once('drain', pump);
      }
      if (!answered) req.end('""]');
    };
    pump();
  });
}

describe('security headers', () => {
  it('sends a CSP that denies plugins, base tags, framing and foreign scripts, and lets the service worker and manifest load', async () => {
    const res = await t.http().get('/api/health');
    const csp = cspOf(res.headers);
    expect(csp.get('default-src')).toBe("'self'");
    expect(csp.get('script-src')).toBe("'self'");
    expect(csp.get('object-src')).toBe("'none'");
    expect(csp.get('base-uri')).toBe("'none'");
    expect(csp.get('frame-ancestors')).toBe("'none'");
    expect(csp.get('form-action')).toBe("'self'");
    expect(csp.get('worker-src')).toBe("'self'");
    expect(csp.get('manifest-src')).toBe("'self'");
    expect(csp.get('connect-src')).toBe("'self'");
    for (const [name, values] of csp) expect(values, name).not.toMatch(/unsafe-eval|\*|https?:/);
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['referrer-policy']).toBe('same-origin');
    expect(res.headers['cross-origin-opener-policy']).toBe('same-origin');
    expect(res.headers['x-frame-options']).toBe('SAMEORIGIN');
    expect(res.headers['x-powered-by']).toBeUndefined();
  });

  it('sends the same headers and no-store on refusals', async () => {
    for (const res of [await t.http().get('/api/no-such-route'), await t.http().get('/api/auth/me'), await t.http().post('/api/parties').send({})]) {
      expect(cspOf(res.headers).get('frame-ancestors')).toBe("'none'");
      expect(res.headers['x-content-type-options']).toBe('nosniff');
      expect(res.headers['cache-control']).toBe('no-store');
    }
  });

  it('asks for HTTPS for a year, subdomains included, when served over HTTPS', async () => {
    const https = await createTestApp({ appUrl: 'https://hitchbook.example' });
    try {
      const res = await https.http().get('/api/health');
      expect(res.headers['strict-transport-security']).toBe('max-age=31536000; includeSubDomains');
      expect(cspOf(res.headers).has('upgrade-insecure-requests')).toBe(true);
    } finally {
      await https.close();
    }
  });
});

describe('cross-origin requests', () => {
  it('gives another origin no CORS permission, on a preflight or on a plain request', async () => {
    const preflight = await t.http().options('/api/parties').set('Origin', 'http://evil.example').set('Access-Control-Request-Method', 'POST').set('Access-Control-Request-Headers', 'authorization,content-type');
    expect(preflight.headers['access-control-allow-origin']).toBeUndefined();
    expect(preflight.headers['access-control-allow-credentials']).toBeUndefined();
    expect(preflight.headers['access-control-allow-headers']).toBeUndefined();
    const { token } = await signIn(t, fx.members.owner.email);
    const read = await t.http().get('/api/parties').set('Origin', 'http://evil.example').set('Authorization', `Bearer ${token}`);
    expect(read.headers['access-control-allow-origin']).toBeUndefined();
  });
});

describe('CSRF on the cookie-bearing routes', () => {
  async function refuses(build: (cookie: string) => Promise<{ status: number; headers: Record<string, unknown> }>) {
    const { cookie } = await signIn(t, fx.members.partner.email);
    const res = await build(cookie);
    expect(res.status).toBe(403);
    // No new tokens go out, and the refused request did not use up the cookie.
    expect(JSON.stringify(res.headers['set-cookie'] ?? '')).not.toMatch(/hb_refresh=[^;]+;/);
    expect((await t.http().post('/api/auth/refresh').set('Cookie', cookie).set(CSRF)).status).toBe(200);
  }

  it('refuses refresh without the app header, with a wrong one, or from a foreign or opaque Origin', async () => {
    await refuses((cookie) => t.http().post('/api/auth/refresh').set('Cookie', cookie));
    await refuses((cookie) => t.http().post('/api/auth/refresh').set('Cookie', cookie).set('X-Requested-With', 'XMLHttpRequest'));
    await refuses((cookie) => t.http().post('/api/auth/refresh').set('Cookie', cookie).set(CSRF).set('Origin', 'http://evil.example'));
    await refuses((cookie) => t.http().post('/api/auth/refresh').set('Cookie', cookie).set(CSRF).set('Origin', 'null'));
    await refuses((cookie) => t.http().post('/api/auth/refresh').set('Cookie', cookie).set(CSRF).set('Origin', 'http://hitchbook.test.evil.example'));
  });

  it('refuses a cross-site logout, which would otherwise end the session', async () => {
    await refuses((cookie) => t.http().post('/api/auth/logout').set('Cookie', cookie).set('Origin', 'http://evil.example'));
  });

  it('accepts the app itself', async () => {
    const { cookie } = await signIn(t, fx.members.partner.email);
    const res = await t.http().post('/api/auth/refresh').set('Cookie', cookie).set(CSRF).set('Origin', 'http://hitchbook.test');
    expect(res.status).toBe(200);
  });
});

describe('oversized JSON bodies', () => {
  it('answers 413 to a declared length over the limit before reading the body', async () => {
    const res = await new Promise<Streamed>((resolve, reject) => {
      const req = httpRequest(
        { host: '127.0.0.1', port, path: '/api/auth/login', method: 'POST', headers: { 'Content-Type': 'application/json', 'Content-Length': String(50 * 1024 * 1024) } },
        (r) => {
          let body = '';
          r.on('data', (c: Buffer) => (body += c.toString()));
          r.on('end', () => resolve({ status: r.statusCode ?? 0, body, sentBytes: 1 }));
        },
      );
      req.on('error', reject);
      // One byte of a promised 50 MB: only a check of the declared length can answer now.
      req.write('{');
    });
    expect(res.status).toBe(413);
    expect(JSON.parse(res.body)).toEqual({ message: 'The request is too large.' });
  });

  it('cuts off a streamed body without a length soon after the limit, on a public and on a signed-in route', async () => {
    const { token } = await signIn(t, fx.members.owner.email);
    for (const [path, headers] of [
      ['/api/auth/login', {}],
      ['/api/parties', { Authorization: `Bearer ${token}` }],
    ] as const) {
      const res = await streamJson(path, 20 * 1024 * 1024, headers);
      expect(res.status, path).toBe(413);
      expect(res.body).not.toMatch(/at |node_modules|\/src\//);
      // Node's socket buffers let some bytes through before the answer is read; never the whole 20 MB.
      expect(res.sentBytes, path).toBeLessThan(LIMIT_BYTES + 4 * 1024 * 1024);
    }
    // The server is still answering afterwards.
    expect((await t.http().get('/api/health')).status).toBe(200);
  });
});
