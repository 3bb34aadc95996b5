import { sql } from 'drizzle-orm';
import pg from 'pg';
import { afterAll, describe, expect, it } from 'vitest';
import { createDb } from './client.js';

const url = process.env.DATABASE_URL;
if (!url) throw new Error('DATABASE_URL is not set: run the tests through `npm test`.');

const observer = new pg.Client({ connectionString: url });
afterAll(() => observer.end());

async function sessionGone(pid: number, timeoutMs = 20_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const { rowCount } = await observer.query('select 1 from pg_stat_activity where pid = $1', [pid]);
    if (rowCount === 0) return;
    if (Date.now() > deadline) throw new Error(`session ${pid} still there after ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

describe('database handle', () => {
  it('ends a transaction left idle, and carries on with a new connection without the process noticing', async () => {
    await observer.connect();
    const h = createDb(url, { max: 1, idleInTransactionTimeoutMs: 300 });
    try {
      const client = await h.pool.connect();
      expect((await client.query('show idle_in_transaction_session_timeout')).rows[0]).toEqual({ idle_in_transaction_session_timeout: '300ms' });
      const pid = (await client.query<{ pid: number }>('select pg_backend_pid() as pid')).rows[0]!.pid;
      await client.query('begin');
      // The server drops the session while it is checked out; its 'error' event must not go unheard.
      await sessionGone(pid);
      await expect(client.query('select 1')).rejects.toThrow();
      client.release(true);
      const again = await h.db.execute<{ pid: number }>(sql`select pg_backend_pid() as pid`);
      expect(again.rows[0]!.pid).not.toBe(pid);
    } finally {
      await h.close();
    }
  });

  it('leaves transactions alone when no idle limit is asked for', async () => {
    const h = createDb(url, { max: 1 });
    try {
      const shown = await h.db.execute<{ idle_in_transaction_session_timeout: string }>(sql`show idle_in_transaction_session_timeout`);
      expect(shown.rows[0]!.idle_in_transaction_session_timeout).toBe('0');
    } finally {
      await h.close();
    }
  });
});
