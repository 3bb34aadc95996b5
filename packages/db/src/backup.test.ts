import { execFile } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runMigrations } from './migrate.js';
import { createDb } from './client.js';
import { seedDemo } from './seed.js';

const baseUrl = process.env.DATABASE_URL;
if (!baseUrl) throw new Error('DATABASE_URL is not set: run the tests through `npm test`.');

const DB_SCRIPT = fileURLToPath(new URL('../../devstack/bin/db.mjs', import.meta.url));
const run = promisify(execFile);

// Named after the test database, so parallel runs against one cluster keep apart.
const tag = randomUUID().replace(/-/g, '').slice(0, 8);
const baseName = new URL(baseUrl).pathname.slice(1);
const names = { source: `${baseName}_bk_src_${tag}`, restored: `${baseName}_bk_dst_${tag}`, live: `${baseName}_bk_live_${tag}`, copy: `${baseName}_bk_copy_${tag}` };
const urlOf = (database: string) => Object.assign(new URL(baseUrl), { pathname: `/${database}` }).toString();
const folder = mkdtempSync(join(tmpdir(), 'hitchbook-backup-test-'));
const backupFile = join(folder, 'demo.dump');

async function admin(sql: string): Promise<void> {
  const client = new pg.Client({ connectionString: urlOf('postgres') });
  await client.connect();
  try {
    await client.query(sql);
  } finally {
    await client.end();
  }
}

async function withClient<T>(database: string, fn: (c: pg.Client) => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString: urlOf(database) });
  await client.connect();
  try {
    return await fn(client);
  } finally {
    await client.end();
  }
}

function dbScript(args: string[], database: string) {
  return run(process.execPath, [DB_SCRIPT, ...args], { env: { ...process.env, DATABASE_URL: urlOf(database) } }).then(
    ({ stdout, stderr }) => ({ code: 0, stdout, stderr }),
    (err: { code: number; stdout: string; stderr: string }) => ({ code: err.code, stdout: err.stdout, stderr: err.stderr }),
  );
}

/** Every table outside the system schemas with a digest of all its rows, so "same data" means byte for byte. */
async function tableDigests(database: string): Promise<Record<string, { rows: number; digest: string }>> {
  return withClient(database, async (c) => {
    const tables = await c.query<{ name: string }>(`
      select format('%I.%I', n.nspname, c.relname) as name from pg_class c join pg_namespace n on n.oid = c.relnamespace
      where c.relkind in ('r', 'p') and n.nspname not like 'pg\\_%' and n.nspname <> 'information_schema' order by 1`);
    const out: Record<string, { rows: number; digest: string }> = {};
    for (const { name } of tables.rows) {
      const { rows } = await c.query<{ rows: string; digest: string }>(`select count(*) as rows, md5(coalesce(string_agg(t::text, '|' order by t::text), '')) as digest from ${name} t`);
      out[name] = { rows: Number(rows[0]!.rows), digest: rows[0]!.digest };
    }
    return out;
  });
}

/** Invoices whose paid amount is not what their payments, less refunds, add up to. */
async function paymentMismatches(c: pg.Client): Promise<unknown[]> {
  const { rows } = await c.query(`
    select i.id, i.amount_paid, coalesce(sum(p.amount - p.amount_refunded), 0) as received
    from invoices i left join payments p on p.invoice_id = i.id
    group by i.id having i.amount_paid <> coalesce(sum(p.amount - p.amount_refunded), 0)`);
  return rows;
}

beforeAll(async () => {
  for (const name of Object.values(names)) await admin(`create database ${name}`);
  await runMigrations(urlOf(names.source));
  const h = createDb(urlOf(names.source), { max: 2 });
  try {
    expect(await seedDemo(h.db)).toBe('seeded');
  } finally {
    await h.close();
  }
}, 120_000);

afterAll(async () => {
  for (const name of Object.values(names)) await admin(`drop database if exists ${name} with (force)`);
  rmSync(folder, { recursive: true, force: true });
});

describe('npm run db:backup and db:restore', () => {
  it('backs up the seeded demo and restores it into an empty database with every row and invariant', async () => {
    const backup = await dbScript(['backup', backupFile], names.source);
    expect(backup, backup.stderr).toMatchObject({ code: 0 });
    expect(backup.stdout).toContain(`Backed up database ${names.source} to ${backupFile}`);
    const restore = await dbScript(['restore', backupFile], names.restored);
    expect(restore, restore.stderr).toMatchObject({ code: 0 });
    expect(restore.stdout).toContain(`into database ${names.restored}`);

    const [before, after] = [await tableDigests(names.source), await tableDigests(names.restored)];
    expect(Object.keys(after)).toEqual(Object.keys(before));
    expect(after).toEqual(before);

    await withClient(names.restored, async (c) => {
      // The demo has issued invoices and payments, so the checks below are not about empty tables.
      const issued = await c.query(`select 1 from invoices where status <> 'draft'`);
      expect(issued.rowCount).toBeGreaterThan(0);
      expect((await c.query('select 1 from payments')).rowCount).toBeGreaterThan(0);

      const series = await c.query<{ operation_id: string; series: string; numbers: number[] }>(
        `select operation_id, series, array_agg(number order by number) as numbers from invoices where number is not null group by 1, 2`,
      );
      for (const s of series.rows) expect(s.numbers, `${s.series} of ${s.operation_id}`).toEqual(s.numbers.map((_, i) => i + 1));
      const counters = await c.query(`
        select k.series from invoice_counters k
        where k.next_number <> 1 + coalesce((select max(number) from invoices i where i.operation_id = k.operation_id and i.series = k.series), 0)`);
      expect(counters.rows).toEqual([]);

      expect(await paymentMismatches(c)).toEqual([]);
      const paid = await c.query(`select 1 from invoices where status = 'issued' and kind = 'invoice' and amount_paid = total and total > 0`);
      expect(paid.rowCount).toBeGreaterThan(0);

      // pg_restore adds the constraints after the data, which checks every row against them.
      expect((await c.query('select conname from pg_constraint where not convalidated')).rows).toEqual([]);
      expect((await c.query('select indexrelid::regclass::text from pg_index where not indisvalid')).rows).toEqual([]);
    });
    const shape = (database: string) =>
      withClient(database, async (c) => {
        const q = (sql: string) => c.query<{ n: string }>(sql).then((r) => Number(r.rows[0]!.n));
        return {
          constraints: await q(`select count(*) as n from pg_constraint k join pg_namespace n on n.oid = k.connamespace where n.nspname = 'public'`),
          triggers: await q('select count(*) as n from pg_trigger where not tgisinternal'),
          indexes: await q(`select count(*) as n from pg_indexes where schemaname = 'public'`),
        };
      });
    expect(await shape(names.restored)).toEqual(await shape(names.source));
  }, 120_000);

  it('takes a consistent backup while payments are being recorded', async () => {
    // A copy of the demo stands in for the live database, so the source stays as the other cases expect.
    expect((await dbScript(['restore', backupFile], names.live)).code).toBe(0);
    const file = join(folder, 'under-load.dump');
    const open = await withClient(names.live, async (c) => {
      const { rows } = await c.query<{ id: string; operation_id: string }>(
        `select id, operation_id from invoices where status = 'issued' and kind = 'invoice' and amount_paid < total order by total desc limit 1`,
      );
      return rows[0];
    });
    expect(open).toBeDefined();
    const countPayments = (c: pg.Client) => c.query<{ n: string }>('select count(*) as n from payments').then((r) => Number(r.rows[0]!.n));
    const before = await withClient(names.live, countPayments);

    // Each payment and the invoice's paid amount change in one transaction, as the app records them.
    let writing = true;
    let recorded = 0;
    const writer = withClient(names.live, async (c) => {
      while (writing) {
        await c.query('begin');
        await c.query(`insert into payments (operation_id, invoice_id, method, amount, received_on, reference) values ($1, $2, 'cash', 0.01, current_date, 'Till')`, [open!.operation_id, open!.id]);
        await c.query('update invoices set amount_paid = amount_paid + 0.01 where id = $1', [open!.id]);
        await c.query('commit');
        recorded += 1;
      }
    });
    try {
      const backup = await dbScript(['backup', file], names.live);
      expect(backup, backup.stderr).toMatchObject({ code: 0 });
    } finally {
      writing = false;
      await writer;
    }
    expect(recorded).toBeGreaterThan(0);
    const restore = await dbScript(['restore', file], names.copy);
    expect(restore, restore.stderr).toMatchObject({ code: 0 });
    await withClient(names.copy, async (c) => {
      expect(await paymentMismatches(c)).toEqual([]);
      const n = await countPayments(c);
      expect(n).toBeGreaterThanOrEqual(before);
      expect(n).toBeLessThanOrEqual(before + recorded);
    });
  }, 120_000);

  it('refuses to restore over data, or from a file that is not a backup, with a message that says why', async () => {
    const again = await dbScript(['restore', backupFile], names.restored);
    expect(again.code).toBe(1);
    expect(again.stderr).toContain(`database ${names.restored} is not empty`);
    expect(again.stderr).toContain('--replace');

    const notBackup = join(folder, 'notes.txt');
    writeFileSync(notBackup, 'not a dump\n');
    const bad = await dbScript(['restore', notBackup], names.restored);
    expect(bad.code).toBe(1);
    expect(bad.stderr).toContain('is not a backup made by npm run db:backup');

    expect((await dbScript(['backup', backupFile], names.source)).stderr).toContain('already exists');
    expect((await dbScript(['restore'], names.restored)).stderr).toContain('restore needs the backup file');

    // Replacing drops what was there first: afterwards the data is the backup's, not doubled.
    const replaced = await dbScript(['restore', backupFile, '--replace'], names.restored);
    expect(replaced, replaced.stderr).toMatchObject({ code: 0 });
    expect(await tableDigests(names.restored)).toEqual(await tableDigests(names.source));
  }, 120_000);
});
