import { mkdtempSync, mkdirSync, writeFileSync } from 'node:fs';
import { get, type IncomingHttpHeaders, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { brotliCompressSync, brotliDecompressSync, gunzipSync, gzipSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from './test-support/test-app.js';

let t: TestApp;
let webDist: string;
const CAB_CHUNK = Buffer.from(`export const passes = [${Array.from({ length: 400 }, (_, i) => `"pass ${i}"`).join(', ')}];`);

/** The bytes as the server sent them: the test client would decode them before a test could look. */
async function rawGet(path: string, acceptEncoding: string): Promise<{ status?: number; headers: IncomingHttpHeaders; body: Buffer }> {
  const server = t.app.getHttpServer() as Server;
  if (!server.listening) await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as AddressInfo;
  return new Promise((resolve, reject) => {
    get({ host: '127.0.0.1', port, path, headers: { 'accept-encoding': acceptEncoding } }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (chunk: Buffer) => chunks.push(chunk));
      res.on('end', () => resolve({ status: res.statusCode, headers: res.headers, body: Buffer.concat(chunks) }));
    }).on('error', reject);
  });
}

beforeAll(async () => {
  webDist = mkdtempSync(join(tmpdir(), 'hb-web-'));
  mkdirSync(join(webDist, 'assets'));
  writeFileSync(join(webDist, 'index.html'), '<!doctype html><title>Hitchbook</title><div id="root"></div>');
  writeFileSync(join(webDist, 'assets', 'app-abc123.js'), 'console.log(1)');
  // A chunk as the web build leaves it: the file and its Brotli and gzip copies beside it.
  writeFileSync(join(webDist, 'assets', 'cab-def456.js'), CAB_CHUNK);
  writeFileSync(join(webDist, 'assets', 'cab-def456.js.br'), brotliCompressSync(CAB_CHUNK));
  writeFileSync(join(webDist, 'assets', 'cab-def456.js.gz'), gzipSync(CAB_CHUNK));
  writeFileSync(join(webDist, 'sw.js'), 'self.addEventListener("fetch", () => {});');
  writeFileSync(join(webDist, 'manifest.webmanifest'), '{"name":"Hitchbook"}');
  mkdirSync(join(webDist, 'api'));
  writeFileSync(join(webDist, 'api', 'health'), 'a file, not the health check');
  t = await createTestApp({ webDist });
});
afterAll(() => t.close());

describe('HTTP surface', () => {
  it('sets a strict content security policy and hides the framework', async () => {
    const res = await t.http().get('/api/health');
    const csp = res.headers['content-security-policy'] as string;
    expect(csp).toContain("default-src 'self'");
    expect(csp).toContain("script-src 'self'");
    expect(csp).toContain("frame-ancestors 'none'");
    expect(csp).not.toMatch(/script-src[^;]*unsafe-inline/);
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['x-powered-by']).toBeUndefined();
    expect(res.headers['cache-control']).toBe('no-store');
    expect(res.headers['x-request-id']).toMatch(/^[0-9a-f-]{36}$/);
  });

  it('sends no CORS permission to another origin', async () => {
    const res = await t.http().options('/api/auth/login').set('Origin', 'https://evil.example').set('Access-Control-Request-Method', 'POST');
    expect(res.headers['access-control-allow-origin']).toBeUndefined();
  });

  it('answers API paths from the API only, never from a file of the web app', async () => {
    const health = await t.http().get('/api/health');
    expect(health.status).toBe(200);
    expect(health.body).toMatchObject({ status: 'ok' });
    expect(health.text).not.toContain('a file');
  });

  it('answers JSON 404 for an unknown API path', async () => {
    const res = await t.http().get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.body).toEqual({ message: 'Not found.' });
  });

  it('answers 400 for malformed JSON and 413 for an oversized body, without internals', async () => {
    const bad = await t.http().post('/api/auth/login').set('Content-Type', 'application/json').send('{"email": ');
    expect(bad.status).toBe(400);
    expect(bad.body).toEqual({ message: 'The request body is not valid JSON.' });
    const big = await t.http().post('/api/auth/login').set('Content-Type', 'application/json').send(JSON.stringify({ email: 'a@b.test', password: 'x'.repeat(300 * 1024) }));
    expect(big.status).toBe(413);
    expect(JSON.stringify(big.body)).not.toMatch(/at |node_modules/);
  });

  it('serves the web app shell for app paths and hashed assets with long caching', async () => {
    const page = await t.http().get('/machines/some/deep/link');
    expect(page.status).toBe(200);
    expect(page.text).toContain('<div id="root">');
    const asset = await t.http().get('/assets/app-abc123.js');
    expect(asset.status).toBe(200);
    expect(asset.headers['cache-control']).toContain('immutable');
  });

  it("sends a browser the web app's smallest copy it accepts: Brotli, else gzip, else the file itself", async () => {
    const brotli = await rawGet('/assets/cab-def456.js', 'gzip, deflate, br');
    expect(brotli.status).toBe(200);
    expect(brotli.headers['content-encoding']).toBe('br');
    expect(brotli.headers['content-type']).toMatch(/^(text|application)\/javascript/);
    expect(brotli.headers['cache-control']).toContain('immutable');
    expect(brotli.headers.vary).toMatch(/Accept-Encoding/);
    expect(brotli.body.length).toBeLessThan(CAB_CHUNK.length / 3);
    expect(brotliDecompressSync(brotli.body).equals(CAB_CHUNK)).toBe(true);

    const gzip = await rawGet('/assets/cab-def456.js', 'gzip, deflate');
    expect(gzip.headers['content-encoding']).toBe('gzip');
    expect(gunzipSync(gzip.body).equals(CAB_CHUNK)).toBe(true);

    const plain = await rawGet('/assets/cab-def456.js', 'identity');
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(plain.body.equals(CAB_CHUNK)).toBe(true);
  });

  it('serves the service worker as a script that a phone checks for updates on every start', async () => {
    const worker = await t.http().get('/sw.js');
    expect(worker.status).toBe(200);
    expect(worker.headers['content-type']).toMatch(/^(text|application)\/javascript/);
    expect(worker.headers['cache-control']).toBe('no-cache');
    expect(worker.text).toContain('addEventListener');
  });

  it('serves the install manifest with its own media type', async () => {
    const manifest = await t.http().get('/manifest.webmanifest');
    expect(manifest.status).toBe(200);
    expect(manifest.headers['content-type']).toContain('application/manifest+json');
    expect(manifest.headers['cache-control']).toBe('no-cache');
  });
});
