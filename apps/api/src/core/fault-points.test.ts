import { afterEach, describe, expect, it, vi } from 'vitest';
import { killPointAfterCommit } from './fault-points.js';

afterEach(() => vi.restoreAllMocks());

describe('fault points', () => {
  it('kill the process at a named point only when NODE_ENV is test', () => {
    const kill = vi.spyOn(process, 'kill').mockImplementation(() => true);
    killPointAfterCommit('invoice-issue', { NODE_ENV: 'production', HB_FAULT_KILL_AFTER_COMMIT: 'invoice-issue' });
    killPointAfterCommit('invoice-issue', { HB_FAULT_KILL_AFTER_COMMIT: 'invoice-issue' });
    killPointAfterCommit('invoice-issue', { NODE_ENV: 'test' });
    killPointAfterCommit('invoice-issue', { NODE_ENV: 'test', HB_FAULT_KILL_AFTER_COMMIT: 'payment-record' });
    expect(kill).not.toHaveBeenCalled();
    killPointAfterCommit('invoice-issue', { NODE_ENV: 'test', HB_FAULT_KILL_AFTER_COMMIT: 'payment-record, invoice-issue' });
    expect(kill).toHaveBeenCalledWith(process.pid, 'SIGKILL');
  });
});
