import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { describeExit, interruptible, sleep, startService } from './proc.mjs';
import { dataDir, inRepo } from './paths.mjs';

export const resultsDir = join(dataDir, 'test-results');

/**
 * Runs one workspace's vitest suite and reads its JSON report.
 * Returns { passed, failed, note }. A run that exits non-zero without a failed test (a file that did not load,
 * an unhandled error) or without a report counts as one failure, so nothing breaks silently.
 */
export async function runWorkspaceTests(workspace, env, { deadline }) {
  mkdirSync(resultsDir, { recursive: true });
  const report = join(resultsDir, `${workspace.replace(/\//g, '-')}.json`);
  rmSync(report, { force: true });
  const vitest = startService(
    `vitest in ${workspace}`,
    process.execPath,
    [inRepo('node_modules', 'vitest', 'vitest.mjs'), 'run', '--reporter=default', '--reporter=json', `--outputFile=${report}`, '--passWithNoTests'],
    { cwd: inRepo(workspace), env },
  );
  let timedOut = false;
  try {
    const timer = sleep(Math.max(0, deadline - Date.now())).then(() => 'timeout');
    timedOut = (await interruptible(Promise.race([vitest.exited, timer]))) === 'timeout';
  } finally {
    await vitest.stop(5_000);
  }
  return summariseRun({ exit: vitest.exitInfo, timedOut, report: existsSync(report) ? readFileSync(report, 'utf8') : null });
}

/** Counts one finished vitest run from its exit and the text of its JSON report (null when none was written). */
export function summariseRun({ exit, timedOut, report }) {
  if (timedOut) return { passed: 0, failed: 1, note: 'stopped: the time budget for the whole run was used up' };
  if (report === null) return { passed: 0, failed: 1, note: `vitest ${describeExit(exit)} without writing a report` };
  let json;
  try {
    json = JSON.parse(report);
  } catch (error) {
    return { passed: 0, failed: 1, note: `its JSON report is unreadable: ${error.message}` };
  }
  const passed = json.numPassedTests ?? 0;
  let failed = json.numFailedTests ?? 0;
  let note = (json.numTotalTests ?? 0) === 0 ? 'no test files' : '';
  if (exit.code !== 0 && failed === 0) {
    failed = 1;
    note = `vitest ${describeExit(exit)} although no test failed (${json.numFailedTestSuites ?? 0} test file(s) failed to run)`;
  }
  return { passed, failed, note };
}
