#!/usr/bin/env node
// The scale dataset for the benchmark: DATABASE_URL when set, else "hitchbook_scale" in the local cluster
// ("hitchbook_scale_1y" with `--years 1`, the one-year database the benchmark compares the reports with),
// recreated for the run. Migrates, then generates two outfits.
import { existsSync } from 'node:fs';
import { runDatabaseScript } from '../lib/database.mjs';
import { DevstackError } from '../lib/log.mjs';
import { inRepo, repoRoot } from '../lib/paths.mjs';
import { createDatabase, dropDatabase } from '../lib/pg.mjs';
import { usePostgres } from '../lib/pg-session.mjs';
import { enterCleanup, installSignalHandlers, run } from '../lib/proc.mjs';

const SCRIPT = 'packages/db/dist/scale/seed-scale.js';
const USAGE = 'Usage: npm run db:seed:scale [-- --years 1..10]   (DATABASE_URL, default database hitchbook_scale, or hitchbook_scale_<n>y for fewer years)';

function parseArgs(args) {
  if (args.length === 0) return [];
  if (args.length === 2 && args[0] === '--years' && /^(10|[1-9])$/.test(args[1])) return args;
  throw new DevstackError(USAGE);
}

async function seed(url, args) {
  if (!existsSync(inRepo(SCRIPT))) throw new DevstackError(`${SCRIPT} does not exist; build the database package (npm run build -w @hitchbook/db)`);
  await runDatabaseScript('migrate', url);
  await run(process.execPath, [inRepo(SCRIPT), ...args], { cwd: repoRoot, env: { ...process.env, DATABASE_URL: url }, label: 'scale seed' });
}

async function main(argv) {
  const args = parseArgs(argv);
  if (process.env.DATABASE_URL) return seed(process.env.DATABASE_URL, args);
  const years = args.length ? Number(args[1]) : 10;
  const database = years === 10 ? 'hitchbook_scale' : `hitchbook_scale_${years}y`;
  const postgres = await usePostgres('seed-scale.mjs');
  try {
    await dropDatabase(database);
    await createDatabase(database);
    await seed(postgres.url(database), args);
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
