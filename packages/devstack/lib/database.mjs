import { existsSync } from 'node:fs';
import { DevstackError } from './log.mjs';
import { inRepo, repoRoot } from './paths.mjs';
import { run } from './proc.mjs';

const SCRIPTS = {
  migrate: 'packages/db/dist/migrate.js',
  seed: 'packages/db/dist/seed.js',
};

/** Runs the database package's built migrate or seed script against `url`. */
export async function runDatabaseScript(task, url) {
  const script = SCRIPTS[task];
  if (!script) throw new DevstackError(`unknown database task "${task}"; use ${Object.keys(SCRIPTS).join(' or ')}`);
  if (!existsSync(inRepo(script))) {
    throw new DevstackError(`${script} does not exist; build the database package (npm run build) — if it is still missing, @hitchbook/db does not provide ${task} yet`);
  }
  const database = new URL(url).pathname.slice(1);
  await run(process.execPath, [inRepo(script)], {
    cwd: repoRoot,
    env: { ...process.env, DATABASE_URL: url },
    label: `${task} of database ${database}`,
  });
}
