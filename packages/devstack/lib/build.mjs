import { DevstackError } from './log.mjs';
import { repoRoot } from './paths.mjs';
import { run } from './proc.mjs';

/** The root build script builds shared, db, mail-catcher, api and web in dependency order. */
export async function buildAll() {
  try {
    await run('npm', ['run', 'build'], { cwd: repoRoot, quiet: true, label: 'npm run build' });
  } catch (error) {
    if (!(error instanceof DevstackError)) throw error;
    // npm goes on with the other workspaces after one fails, so the culprit is easy to miss in the output.
    const failed = [...new Set([...(error.details ?? '').matchAll(/^npm error workspace (\S+)/gm)].map((m) => m[1]))];
    throw failed.length > 0 ? new DevstackError(`${error.message}; it failed in ${failed.join(', ')} (output above)`, { details: error.details }) : error;
  }
}
