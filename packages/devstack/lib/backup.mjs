import { existsSync, mkdirSync, renameSync, rmSync, statSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { DevstackError } from './log.mjs';
import { dataDir } from './paths.mjs';
import { PG_BIN } from './pg.mjs';
import { run } from './proc.mjs';

/** The caller's PG* variables would redirect the PostgreSQL tools away from the URL they are given. */
function toolEnv() {
  return Object.fromEntries(Object.entries(process.env).filter(([key]) => !key.startsWith('PG')));
}

const databaseOf = (url) => decodeURIComponent(new URL(url).pathname.slice(1));

export function defaultBackupFile(url) {
  const stamp = new Date().toISOString().replace(/[-:]/g, '').replace(/\..*$/, 'Z');
  return join(dataDir, 'backups', `${databaseOf(url)}-${stamp}.dump`);
}

async function query(url, sql) {
  const { code, output } = await run(join(PG_BIN, 'psql'), ['-X', '-q', '-tA', '-v', 'ON_ERROR_STOP=1', '-d', url, '-c', sql], {
    quiet: true,
    allowFailure: true,
    env: toolEnv(),
  });
  if (code !== 0) {
    const database = databaseOf(url);
    if (/database "[^"]*" does not exist/.test(output)) throw new DevstackError(`database ${database} does not exist; create it first (createdb, or psql -c "create database ${database}")`);
    throw new DevstackError(`cannot reach database ${database}: ${output.trim().split('\n').pop()}`);
  }
  return output.trim();
}

/**
 * pg_dump in the custom format: a consistent snapshot taken while the app keeps running. It is written
 * next to its final name and moved there when complete, so a failed dump never looks like a backup.
 * Roles and other cluster-wide settings are not in it (pg_dump covers one database).
 */
export async function backupDatabase(url, file) {
  const target = resolve(file);
  if (existsSync(target)) throw new DevstackError(`${target} already exists; give a new file name`);
  await query(url, 'select 1');
  mkdirSync(dirname(target), { recursive: true });
  const partial = `${target}.partial`;
  try {
    await run(join(PG_BIN, 'pg_dump'), ['--format=custom', '--no-owner', '--no-privileges', `--file=${partial}`, `--dbname=${url}`], {
      quiet: true,
      env: toolEnv(),
      label: `pg_dump of database ${databaseOf(url)}`,
    });
    renameSync(partial, target);
  } finally {
    rmSync(partial, { force: true });
  }
  return { file: target, bytes: statSync(target).size };
}

const USER_SCHEMAS = "select nspname from pg_namespace where nspname not like 'pg\\_%' and nspname <> 'information_schema'";

/**
 * pg_restore of a backup into `url`, in one transaction, so a failed restore leaves the database as it
 * was. The database must be empty unless `replace` is set, which drops its contents first (inside the
 * same transaction as the restore).
 */
export async function restoreDatabase(url, file, { replace = false } = {}) {
  const source = resolve(file);
  if (!existsSync(source)) throw new DevstackError(`${source} does not exist`);
  const listed = await run(join(PG_BIN, 'pg_restore'), ['--list', source], { quiet: true, allowFailure: true, env: toolEnv() });
  if (listed.code !== 0) throw new DevstackError(`${source} is not a backup made by npm run db:backup (pg_restore cannot read it)`, { details: listed.output });

  const database = databaseOf(url);
  const tables = Number(await query(url, `select count(*) from pg_class c join pg_namespace n on n.oid = c.relnamespace where c.relkind in ('r', 'p') and n.nspname in (${USER_SCHEMAS})`));
  if (tables > 0 && !replace) {
    throw new DevstackError(`database ${database} is not empty (${tables} tables); restore into an empty database, or add --replace to drop everything in ${database} first`);
  }
  const schemas = replace ? (await query(url, USER_SCHEMAS)).split('\n').filter(Boolean) : [];
  // pg_restore --single-transaction cannot take extra statements, so the clearing and the restore run as
  // one psql script inside one transaction.
  const { output: script } = await run(join(PG_BIN, 'pg_restore'), ['--no-owner', '--no-privileges', '--file=-', source], { quiet: true, env: toolEnv() });
  const clear = schemas.map((s) => `drop schema "${s.replace(/"/g, '""')}" cascade;`).join('\n');
  await run(join(PG_BIN, 'psql'), ['-X', '-q', '-v', 'ON_ERROR_STOP=1', '--single-transaction', '-d', url, '-f', '-'], {
    quiet: true,
    input: `${clear}\n${replace ? 'create schema if not exists public;\n' : ''}${script}`,
    env: toolEnv(),
    label: `restore into database ${database}`,
  });
  return { database, replaced: tables > 0 };
}
