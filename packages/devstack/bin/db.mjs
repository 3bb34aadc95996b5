#!/usr/bin/env node
// Migrates, seeds, backs up or restores a database: DATABASE_URL when set, else "hitchbook" in the local cluster (started for the run if needed).
import { backupDatabase, defaultBackupFile, restoreDatabase } from '../lib/backup.mjs';
import { runDatabaseScript } from '../lib/database.mjs';
import { DevstackError } from '../lib/log.mjs';
import { createDatabase } from '../lib/pg.mjs';
import { usePostgres } from '../lib/pg-session.mjs';
import { enterCleanup, installSignalHandlers } from '../lib/proc.mjs';

const USAGE = 'Usage: node packages/devstack/bin/db.mjs migrate | seed | backup [file] | restore <file> [--replace]';

/** Checks the arguments; answers what to do with a database URL. */
function taskOf(args) {
  const [task, ...rest] = args;
  if ((task === 'migrate' || task === 'seed') && rest.length === 0) return (url) => runDatabaseScript(task, url);
  if (task === 'backup' && rest.length <= 1 && !rest[0]?.startsWith('-')) {
    return async (url) => {
      const { file, bytes } = await backupDatabase(url, rest[0] ?? defaultBackupFile(url));
      console.log(`Backed up database ${new URL(url).pathname.slice(1)} to ${file} (${Math.ceil(bytes / 1024)} kB).`);
    };
  }
  const options = rest.filter((a) => a.startsWith('-'));
  const files = rest.filter((a) => !a.startsWith('-'));
  if (task === 'restore' && files.length === 1 && options.every((o) => o === '--replace')) {
    return async (url) => {
      const { database, replaced } = await restoreDatabase(url, files[0], { replace: options.length > 0 });
      console.log(`Restored ${files[0]} into database ${database}${replaced ? ', replacing what it held' : ''}.`);
    };
  }
  throw new DevstackError(task === 'restore' && files.length === 0 ? `restore needs the backup file to read\n${USAGE}` : USAGE);
}

async function main(args) {
  const task = taskOf(args);
  if (process.env.DATABASE_URL) {
    await task(process.env.DATABASE_URL);
    return;
  }
  const postgres = await usePostgres(`db.mjs ${args[0]}`);
  try {
    await createDatabase('hitchbook');
    await task(postgres.url('hitchbook'));
  } finally {
    enterCleanup();
    await postgres.release();
  }
}

installSignalHandlers();
main(process.argv.slice(2)).then(
  () => process.exit(0),
  (error) => {
    if (error.details) console.error(error.details.trimEnd());
    console.error(`✗ ${error.message}`);
    process.exit(1);
  },
);
