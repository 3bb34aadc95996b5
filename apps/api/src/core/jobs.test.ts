import { randomUUID } from 'node:crypto';
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { waitForMail } from '../test-support/mailbox.js';
import { TcpProxy } from '../test-support/tcp-proxy.js';
import { createTestApp, testConfig, type TestApp } from '../test-support/test-app.js';
import { MAIL_QUEUE, MailQueue } from './jobs.mail.js';

let t: TestApp;
let down: TestApp;
let smtp: TcpProxy;
// A queue of its own, so no other test's worker can take (or be slowed by) the jobs of the app whose mail server is down.
const privateSchema = `pgboss_jobs_test_${randomUUID().slice(0, 8)}`;

async function jobRow(app: TestApp, schema: string, id: string): Promise<{ state: string; retry_count: number } | undefined> {
  const result = await app.dbh.db.execute<{ state: string; retry_count: number }>(sql`select state, retry_count from ${sql.identifier(schema)}.job where id = ${id}`);
  return result.rows[0];
}

async function eventually<T>(probe: () => Promise<T | undefined>, ok: (v: T) => boolean, timeoutMs = 15_000): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await probe();
    if (value !== undefined && ok(value)) return value;
    if (Date.now() > deadline) throw new Error(`condition not met within ${timeoutMs} ms; last value ${JSON.stringify(value)}`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

beforeAll(async () => {
  t = await createTestApp();
  const base = testConfig();
  smtp = new TcpProxy(base.smtpHost, base.smtpPort);
  await smtp.open();
  await smtp.cut();
  down = await createTestApp({ smtpPort: smtp.port, jobs: { ...base.jobs, schema: privateSchema, pollingIntervalSeconds: 0.5, mailRetryDelaySeconds: 1 } });
});
afterAll(async () => {
  await down.close();
  await smtp.cut();
  await t.dbh.db.execute(sql`drop schema if exists ${sql.identifier(privateSchema)} cascade`);
  await t.close();
});

describe('job queue', () => {
  it('delivers a queued e-mail through the mail server', async () => {
    const to = `queued-${randomUUID().slice(0, 8)}@example.test`;
    await t.app.get(MailQueue).enqueue({ to, subject: 'Queued hello', text: 'Sent from the queue.' });
    const mail = await waitForMail(to, 'Queued hello');
    expect(mail.text).toContain('Sent from the queue.');
  });

  it('keeps a job queued inside a transaction only when that transaction commits', async () => {
    const queue = t.app.get(MailQueue);
    let rolledBackId = '';
    await expect(
      t.dbh.db.transaction(async (tx) => {
        rolledBackId = await queue.enqueue({ to: 'nobody@example.test', subject: 'Never sent', text: 'x' }, tx);
        throw new Error('the change failed');
      }),
    ).rejects.toThrow('the change failed');
    expect(rolledBackId).toMatch(/^[0-9a-f-]{36}$/);
    expect(await jobRow(t, 'pgboss', rolledBackId)).toBeUndefined();

    const to = `committed-${randomUUID().slice(0, 8)}@example.test`;
    const committedId = await t.dbh.db.transaction((tx) => queue.enqueue({ to, subject: 'Committed hello', text: 'y' }, tx));
    expect(await jobRow(t, 'pgboss', committedId)).toBeDefined();
    await waitForMail(to, 'Committed hello');
  });

  it('stores a queued e-mail sealed, so its link cannot be read from the job table', async () => {
    const id = await t.app.get(MailQueue).enqueue({ to: 'sealed@example.test', subject: 'Secret link', text: 'https://hitchbook.test/reset?token=abc123' });
    const result = await t.dbh.db.execute<{ data: unknown }>(sql`select data from pgboss.job where name = ${MAIL_QUEUE} and id = ${id}
      union all select data from pgboss.archive where name = ${MAIL_QUEUE} and id = ${id}`);
    const stored = JSON.stringify(result.rows[0]?.data);
    expect(stored).toContain('sealed');
    expect(stored).not.toMatch(/abc123|sealed@example|Secret link/);
  });

  it('retries an e-mail while the mail server is unreachable and delivers it once it is back', async () => {
    const to = `retried-${randomUUID().slice(0, 8)}@example.test`;
    const id = await down.app.get(MailQueue).enqueue({ to, subject: 'Patient hello', text: 'Delivered on a retry.' });
    const failed = await eventually(() => jobRow(down, privateSchema, id), (row) => row.retry_count >= 1);
    expect(['retry', 'active', 'created']).toContain(failed.state);

    await smtp.open(smtp.port);
    const mail = await waitForMail(to, 'Patient hello', 20_000);
    expect(mail.text).toContain('Delivered on a retry.');
    const done = await eventually(() => jobRow(down, privateSchema, id), (row) => row.state === 'completed');
    expect(done.retry_count).toBeGreaterThanOrEqual(1);
  });
});
