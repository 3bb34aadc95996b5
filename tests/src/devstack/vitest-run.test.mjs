import { describe, expect, it } from 'vitest';
import { summariseRun } from '../../../packages/devstack/lib/vitest-run.mjs';

const report = (counts) => JSON.stringify({ numTotalTests: 0, numPassedTests: 0, numFailedTests: 0, numFailedTestSuites: 0, ...counts });

describe('summariseRun', () => {
  it('takes the counts of a clean run from its report', () => {
    expect(summariseRun({ exit: { code: 0 }, timedOut: false, report: report({ numTotalTests: 12, numPassedTests: 12 }) })).toEqual({
      passed: 12,
      failed: 0,
      note: '',
    });
  });

  it('keeps the failed count of a run with failing tests', () => {
    const summary = summariseRun({ exit: { code: 1 }, timedOut: false, report: report({ numTotalTests: 5, numPassedTests: 3, numFailedTests: 2 }) });
    expect(summary).toEqual({ passed: 3, failed: 2, note: '' });
  });

  it('counts a workspace without test files as skipped, not failed', () => {
    expect(summariseRun({ exit: { code: 0 }, timedOut: false, report: report({}) })).toEqual({ passed: 0, failed: 0, note: 'no test files' });
  });

  it('counts a failure when vitest exits non-zero although no test failed, as when a test file does not load', () => {
    const summary = summariseRun({ exit: { code: 1 }, timedOut: false, report: report({ numTotalTests: 4, numPassedTests: 4, numFailedTestSuites: 1 }) });
    expect(summary.passed).toBe(4);
    expect(summary.failed).toBe(1);
    expect(summary.note).toBe('vitest exited with code 1 although no test failed (1 test file(s) failed to run)');
  });

  it('counts a failure when vitest crashed without a report', () => {
    expect(summariseRun({ exit: { code: null, signal: 'SIGKILL' }, timedOut: false, report: null })).toEqual({
      passed: 0,
      failed: 1,
      note: 'vitest was killed by SIGKILL without writing a report',
    });
  });

  it('counts a failure when the report is not JSON', () => {
    const summary = summariseRun({ exit: { code: 0 }, timedOut: false, report: '{"numPassed' });
    expect(summary.failed).toBe(1);
    expect(summary.note).toMatch(/^its JSON report is unreadable: /);
  });

  it('counts a failure when the run was stopped for using up the time budget', () => {
    expect(summariseRun({ exit: { code: null, signal: 'SIGTERM' }, timedOut: true, report: report({ numPassedTests: 9 }) })).toEqual({
      passed: 0,
      failed: 1,
      note: 'stopped: the time budget for the whole run was used up',
    });
  });
});
