import { sql } from 'drizzle-orm';
import { createDb, type DbHandle } from '@hitchbook/db';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addEntry, addNeighbourSheet, createBillingWorld, type BillingWorld } from '../modules/invoices/billing-world.fixture.js';
import { ApiProcess } from '../test-support/api-process.js';
import { createOperation, FIXTURE_PASSWORD, type OperationFixture } from '../test-support/fixtures.js';
import { freePort } from '../test-support/free-port.js';
import { waitForMail } from '../test-support/mailbox.js';
import { waitFor } from '../test-support/poll.js';

const databaseUrl = process.env.DATABASE_URL;
if (!databaseUrl) throw new Error('DATABASE_URL is not set: run the tests through `npm test`.');

/** The two instances share a job queue of their own, so no other test's app can take their jobs. */
const JOB_SCHEMA = 'pgboss_scale_out';
const APP_URL = 'http://hitchbook.test';

let dbh: DbHandle;
let a: ApiProcess;
let b: ApiProcess;
let world: BillingWorld<OperationFixture>;

beforeAll(async () => {
  dbh = createDb(databaseUrl, { max: 2, applicationName: 'hitchbook-test' });
  world = await createBillingWorld(dbh.db, await createOperation(dbh.db, 'Two-instance outfit'));
  await addNeighbourSheet(dbh.db, world);
  // A looks for queued jobs only once an hour and cannot reach a mail server, so a mail that arrives
  // was sent by B.
  a = new ApiProcess({
    databaseUrl,
    env: { APP_URL, JOB_SCHEMA, JOB_POLL_SECONDS: '3600', SMTP_PORT: String(await freePort()), MAIL_RETRY_DELAY_SECONDS: '3600' },
  });
  b = new ApiProcess({ databaseUrl, env: { APP_URL, JOB_SCHEMA, JOB_POLL_SECONDS: '0.5' } });
  // One after the other: the first creates the queue's schema.
  await a.start();
  await b.start();
}, 180_000);

afterAll(async () => {
  await a?.dispose();
  await b?.dispose();
  await dbh?.close();
});

const login = (api: ApiProcess, email: string, password = FIXTURE_PASSWORD) =>
  api.fetch('/api/auth/login', { method: 'POST', body: JSON.stringify({ email, password }) });

function refreshCookieOf(res: Response): string {
  const cookie = res.headers.getSetCookie().find((c) => c.startsWith('hb_refresh='));
  if (!cookie) throw new Error(`no refresh cookie in the answer (${res.status})`);
  return cookie.split(';')[0]!;
}

const withCookie = (api: ApiProcess, path: string, cookie: string) =>
  api.fetch(path, { method: 'POST', headers: { Cookie: cookie, 'X-Requested-With': 'hitchbook', Origin: APP_URL } });

const me = (api: ApiProcess, token: string) => api.fetch('/api/auth/me', { token });

describe('two API instances on one database', () => {
  it('count sign-in failures together: five on each lock the account on both', async () => {
    const email = world.fx.members.partner.email;
    for (const api of [a, b]) {
      for (let i = 0; i < 5; i++) expect((await login(api, email, 'not-the-password')).status).toBe(401);
    }
    // With counts kept per process, each would have seen only five failures and let this through.
    for (const api of [a, b]) {
      const res = await login(api, email);
      expect(res.status).toBe(429);
      expect(Number(res.headers.get('retry-after'))).toBeGreaterThan(0);
    }
    // Other accounts are not affected.
    expect((await login(b, world.fx.members.bookkeeper.email)).status).toBe(200);
  });

  it('detect a refresh token rotated on one instance and presented again on the other', async () => {
    const signedIn = await login(a, world.fx.members.owner.email);
    expect(signedIn.status).toBe(200);
    const first = refreshCookieOf(signedIn);
    const rotated = await withCookie(a, '/api/auth/refresh', first);
    expect(rotated.status).toBe(200);
    const second = refreshCookieOf(rotated);
    const { accessToken } = (await rotated.json()) as { accessToken: string };
    expect((await me(b, accessToken)).status).toBe(200);

    expect((await withCookie(b, '/api/auth/refresh', first)).status).toBe(401);
    // The reuse ended the whole session: the newer refresh token and its access token stop working on both.
    expect((await withCookie(a, '/api/auth/refresh', second)).status).toBe(401);
    for (const api of [a, b]) expect((await me(api, accessToken)).status).toBe(401);
  });

  it('end a session on both when it is logged out on one', async () => {
    const signedIn = await login(a, world.fx.members.owner.email);
    const cookie = refreshCookieOf(signedIn);
    const { accessToken } = (await signedIn.json()) as { accessToken: string };
    expect((await me(b, accessToken)).status).toBe(200);
    expect((await withCookie(a, '/api/auth/logout', cookie)).status).toBe(204);
    expect((await me(b, accessToken)).status).toBe(401);
    expect((await withCookie(b, '/api/auth/refresh', cookie)).status).toBe(401);
  });

  it('let one instance send a mail the other queued just before it stopped', async () => {
    const token = ((await (await login(a, world.fx.members.owner.email)).json()) as { accessToken: string }).accessToken;
    await addEntry(dbh.db, world, { workDate: '2025-06-02', workTypeId: world.workTypes.mowing, fieldId: world.fields.creekBottom, billToPartyId: world.fx.customers[0], hours: '2.00', acres: '10.000' });
    const draft = await a.fetch('/api/invoices/drafts', { method: 'POST', token, body: JSON.stringify({ partyId: world.fx.customers[0], from: '2025-06-01', to: '2025-06-30' }) });
    expect(draft.status).toBe(201);
    const { id } = (await draft.json()) as { id: string };
    expect((await a.fetch(`/api/invoices/${id}/issue`, { method: 'POST', token, body: '{}' })).status).toBe(200);

    const sent = await a.fetch(`/api/invoices/${id}/send`, { method: 'POST', token, body: '{}' });
    expect(sent.status).toBe(202);
    const { to } = (await sent.json()) as { to: string };
    await a.kill();

    const mail = await waitForMail(to, 'INV-0001', 60_000);
    expect(mail.attachments.map((f) => f.contentType)).toContain('application/pdf');
    const job = await waitFor('the job to be marked done', async () => {
      const rows = await dbh.db.execute<{ state: string }>(sql`select state from ${sql.identifier(JOB_SCHEMA)}.job where name = 'invoice-mail' and data->>'invoiceId' = ${id}`);
      return rows.rows[0]?.state === 'completed' ? rows.rows[0] : undefined;
    });
    expect(job.state).toBe('completed');
  }, 120_000);
});
