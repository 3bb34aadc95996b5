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
const names = { source: `${baseName}_bk_src_${tag}`, restored: `${baseName}_bk_dst_${tag}` };
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

beforeAll(async () => {
  await admin(`create database ${names.source}`);
  await admin(`create database ${names.restored}`);
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

      const mismatched = await c.query(`
        select i.id, i.amount_paid, coalesce(sum(p.amount) filter (where p.status = 'succeeded'), 0) as received
        from invoices i left join payments p on p.invoice_id = i.id
        group by i.id having i.amount_paid <> coalesce(sum(p.amount) filter (where p.status = 'succeeded'), 0)`);
      expect(mismatched.rows).toEqual([]);
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
