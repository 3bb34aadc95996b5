import { existsSync } from 'node:fs';
import { createInterface } from 'node:readline';
import { startApi } from './api-server.mjs';
import { Interrupted, info, warn } from './log.mjs';
import { describeExit, startService } from './proc.mjs';
import { inRepo, repoRoot } from './paths.mjs';

const API_TSCONFIG = 'apps/api/tsconfig.build.json';
const COMPILE_DONE = /Found (\d+) errors?\. Watching for file changes/;

/**
 * For `npm run dev`: keeps tsc --watch on the API and restarts the API after every clean recompile.
 * A compile with errors leaves the running API alone. Changes to shared or db packages need a restart of the script.
 */
export async function startWatchedApi(env) {
  let api = await startApi(env);
  if (!existsSync(inRepo(API_TSCONFIG))) {
    warn(`${API_TSCONFIG} is missing, so the API is not rebuilt on change`);
    return { services: [api], stop: () => api.stop() };
  }
  const compiler = startService(
    'API compiler',
    process.execPath,
    [inRepo('node_modules', 'typescript', 'bin', 'tsc'), '-p', API_TSCONFIG, '--watch', '--preserveWatchOutput'],
    { cwd: repoRoot, stdout: 'pipe' },
  );
  let compiles = 0;
  let restarting = Promise.resolve();
  let stopping = false;
  const restart = async () => {
    if (stopping) return;
    info('[api] recompiled; restarting the API…');
    await api.stop();
    try {
      api = await startApi(env);
      info('[api] restarted');
    } catch (error) {
      if (!stopping && !(error instanceof Interrupted)) warn(`[api] did not come back: ${error.message}; save a fix to try again`);
    }
  };
  createInterface({ input: compiler.child.stdout }).on('line', (line) => {
    const done = COMPILE_DONE.exec(line);
    if (!done) {
      if (/error TS\d+/.test(line)) console.error(`[tsc] ${line}`);
      return;
    }
    compiles += 1;
    // The first compile only repeats the build that just ran.
    if (compiles === 1) return;
    if (done[1] === '0') restarting = restarting.then(restart);
    else warn(`[api] ${done[1]} TypeScript error(s); the running API is left as it was`);
  });
  compiler.exited.then((exit) => {
    if (!stopping) warn(`API compiler ${describeExit(exit)}; the API is no longer rebuilt on change`);
  });
  return {
    /** Started now; an API restarted later is a new process. */
    services: [api, compiler],
    async stop() {
      stopping = true;
      await compiler.stop();
      await restarting;
      await api.stop();
    },
  };
}
