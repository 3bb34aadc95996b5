import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createOperation, FIXTURE_PASSWORD, type OperationFixture } from '../../test-support/fixtures.js';
import { TcpProxy } from '../../test-support/tcp-proxy.js';
import { createTestApp, testConfig, type TestApp } from '../../test-support/test-app.js';

let direct: TestApp;
let viaProxy: TestApp;
let proxy: TcpProxy;
let fx: OperationFixture;

beforeAll(async () => {
  direct = await createTestApp();
  fx = await createOperation(direct.dbh.db);
  const url = new URL(testConfig().databaseUrl);
  proxy = new TcpProxy(url.hostname, Number(url.port));
  await proxy.open();
  url.hostname = '127.0.0.1';
  url.port = String(proxy.port);
  viaProxy = await createTestApp({ databaseUrl: url.toString() });
});
afterAll(async () => {
  await proxy.open();
  await viaProxy.close();
  await direct.close();
  await proxy.cut();
});

describe('health and database outages', () => {
  it('reports ok when the database answers', async () => {
    const res = await direct.http().get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ status: 'ok', db: 'ok' });
  });

  it('answers 503 while the database is unreachable and recovers by itself', async () => {
    expect((await viaProxy.http().get('/api/health')).status).toBe(200);
    await proxy.cut();

    const health = await viaProxy.http().get('/api/health');
    expect(health.status).toBe(503);
    expect(health.body.db).toBe('down');
    const login = await viaProxy.http().post('/api/auth/login').send({ email: fx.members.owner.email, password: FIXTURE_PASSWORD });
    expect(login.status).toBe(503);
    expect(JSON.stringify(login.body)).not.toMatch(/ECONN|stack|postgres/i);

    await proxy.open();
    let recovered = 0;
    for (let i = 0; i < 20 && recovered !== 200; i++) {
      recovered = (await viaProxy.http().get('/api/health')).status;
      if (recovered !== 200) await new Promise((r) => setTimeout(r, 250));
    }
    expect(recovered).toBe(200);
    expect((await viaProxy.http().post('/api/auth/login').send({ email: fx.members.owner.email, password: FIXTURE_PASSWORD })).status).toBe(200);
  });
});
