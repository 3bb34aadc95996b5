import { existsSync, mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { withFileLock } from './locks.mjs';
import { info } from './log.mjs';
import { runDir } from './paths.mjs';
import { databaseUrl, ensurePostgresInstalled, initCluster, pgPort, setAppPassword, startPostgres, stopPostgres } from './pg.mjs';
import { processIsAlive } from './proc.mjs';
import { localSecrets } from './secrets.mjs';

/**
 * Scripts that use the cluster register here. The cluster is stopped by whichever script leaves last, but only when
 * a script started it: a cluster someone started by hand (bin/pg.mjs start) keeps running.
 */
const usersDir = join(runDir, 'postgres-users');
const startedBySessionMarker = join(usersDir, 'started-by-script');
const LOCK = 'postgres';

function otherLiveUsers() {
  return readdirSync(usersDir)
    .filter((name) => /^\d+$/.test(name) && Number(name) !== process.pid)
    .filter((name) => {
      if (processIsAlive(Number(name))) return true;
      rmSync(join(usersDir, name), { force: true });
      return false;
    });
}

async function bringUp(postgresPassword) {
  await initCluster(postgresPassword);
  const outcome = await startPostgres();
  await setAppPassword(postgresPassword);
  return outcome;
}

/** Installs, creates and starts the cluster as needed; returns { outcome, url(db), release() }. */
export async function usePostgres(purpose) {
  await ensurePostgresInstalled();
  const { postgresPassword } = localSecrets();
  const outcome = await withFileLock(LOCK, async () => {
    const started = await bringUp(postgresPassword);
    mkdirSync(usersDir, { recursive: true });
    writeFileSync(join(usersDir, String(process.pid)), purpose);
    if (started === 'started') writeFileSync(startedBySessionMarker, String(process.pid));
    return started;
  });
  info(outcome === 'started' ? `PostgreSQL started on 127.0.0.1:${pgPort()}` : `PostgreSQL already runs on 127.0.0.1:${pgPort()}; using it`);
  let released = false;
  return {
    outcome,
    url: (database) => databaseUrl(database, postgresPassword),
    /** Returns 'stopped' when this was the last script using a cluster that a script had started, else 'kept'. */
    async release() {
      if (released) return 'kept';
      released = true;
      return withFileLock(LOCK, async () => {
        rmSync(join(usersDir, String(process.pid)), { force: true });
        mkdirSync(usersDir, { recursive: true });
        if (!existsSync(startedBySessionMarker) || otherLiveUsers().length > 0) return 'kept';
        await stopPostgres();
        rmSync(startedBySessionMarker, { force: true });
        return 'stopped';
      });
    },
  };
}

/** Starts the cluster for a person; no script stops it on exit afterwards. Returns 'started' or 'already-running'. */
export async function startByHand() {
  await ensurePostgresInstalled();
  const { postgresPassword } = localSecrets();
  return withFileLock(LOCK, async () => {
    const outcome = await bringUp(postgresPassword);
    rmSync(startedBySessionMarker, { force: true });
    return outcome;
  });
}

/** Stops the cluster; returns the outcome and the purposes of scripts that were still using it. */
export async function stopByHand() {
  return withFileLock(LOCK, async () => {
    mkdirSync(usersDir, { recursive: true });
    const stillUsing = otherLiveUsers().map((pid) => `${readFileSync(join(usersDir, pid), 'utf8')} (pid ${pid})`);
    const outcome = await stopPostgres();
    rmSync(startedBySessionMarker, { force: true });
    return { outcome, stillUsing };
  });
}

export function appDatabaseUrl(database) {
  return databaseUrl(database, localSecrets().postgresPassword);
}
