#!/usr/bin/env node
// Migrates or seeds a database: DATABASE_URL when set, else "hitchbook" in the local cluster (started for the run if needed).
import { runDatabaseScript } from '../lib/database.mjs';
import { DevstackError } from '../lib/log.mjs';
import { createDatabase } from '../lib/pg.mjs';
import { usePostgres } from '../lib/pg-session.mjs';
import { enterCleanup, installSignalHandlers } from '../lib/proc.mjs';

const USAGE = 'Usage: node packages/devstack/bin/db.mjs migrate | seed';

async function main(args) {
  const [task] = args;
  if (args.length !== 1 || (task !== 'migrate' && task !== 'seed')) throw new DevstackError(USAGE);
  if (process.env.DATABASE_URL) {
    await runDatabaseScript(task, process.env.DATABASE_URL);
    return;
  }
  const postgres = await usePostgres(`db.mjs ${task}`);
  try {
    await createDatabase('hitchbook');
    await runDatabaseScript(task, postgres.url('hitchbook'));
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
