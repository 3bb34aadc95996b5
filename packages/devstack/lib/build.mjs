import { repoRoot } from './paths.mjs';
import { run } from './proc.mjs';

/** The root build script builds shared, db, mail-catcher, api and web in dependency order. */
export async function buildAll() {
  await run('npm', ['run', 'build'], { cwd: repoRoot, quiet: true, label: 'npm run build' });
}
