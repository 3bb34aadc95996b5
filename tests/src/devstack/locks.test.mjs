import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { claimSingleRun, withFileLock } from '../../../packages/devstack/lib/locks.mjs';

const dirs = [];
function freshDir() {
  const dir = mkdtempSync(join(tmpdir(), 'hitchbook-locks-'));
  dirs.push(dir);
  return dir;
}
afterEach(() => dirs.splice(0).forEach((d) => rmSync(d, { recursive: true, force: true })));

/** The id of a process that has certainly exited. */
function deadPid() {
  return spawnSync(process.execPath, ['-e', '']).pid;
}

describe('claimSingleRun', () => {
  it('refuses a second claim while the holder lives and names the holder', () => {
    const dir = freshDir();
    const first = claimSingleRun('start', { mode: 'start' }, dir);
    expect(first.claimed).toBe(true);
    first.update({ appUrl: 'http://localhost:3000' });

    const second = claimSingleRun('start', { mode: 'dev' }, dir);
    expect(second.claimed).toBe(false);
    expect(second.holder).toMatchObject({ pid: process.pid, mode: 'start', appUrl: 'http://localhost:3000' });
  });

  it('can be claimed again once released', () => {
    const dir = freshDir();
    claimSingleRun('start', {}, dir).release();
    expect(existsSync(join(dir, 'start.json'))).toBe(false);
    expect(claimSingleRun('start', {}, dir).claimed).toBe(true);
  });

  it('takes over a claim left by a process that died', () => {
    const dir = freshDir();
    writeFileSync(join(dir, 'start.json'), JSON.stringify({ pid: deadPid(), since: '2026-01-01T00:00:00Z' }));
    const claim = claimSingleRun('start', { mode: 'start' }, dir);
    expect(claim.claimed).toBe(true);
    expect(JSON.parse(readFileSync(join(dir, 'start.json'), 'utf8'))).toMatchObject({ pid: process.pid, mode: 'start' });
  });
});

describe('withFileLock', () => {
  it('runs two holders one after the other, never together', async () => {
    const dir = freshDir();
    const events = [];
    const holder = (name) =>
      withFileLock(
        'postgres',
        async () => {
          events.push(`${name} in`);
          await new Promise((r) => setTimeout(r, 300));
          events.push(`${name} out`);
        },
        { dir },
      );
    await Promise.all([holder('a'), holder('b')]);
    expect(events).toEqual(['a in', 'a out', 'b in', 'b out']);
  });

  it('takes over a lock whose owner died and releases it afterwards', async () => {
    const dir = freshDir();
    mkdirSync(join(dir, 'postgres.lock'));
    writeFileSync(join(dir, 'postgres.lock', 'owner.json'), JSON.stringify({ pid: deadPid() }));
    await expect(withFileLock('postgres', async () => 'done', { dir, timeoutMs: 2000 })).resolves.toBe('done');
    expect(existsSync(join(dir, 'postgres.lock'))).toBe(false);
  });

  it('gives up with the holder named when a live owner keeps the lock too long', async () => {
    const dir = freshDir();
    mkdirSync(join(dir, 'postgres.lock'));
    writeFileSync(join(dir, 'postgres.lock', 'owner.json'), JSON.stringify({ pid: process.pid }));
    await expect(withFileLock('postgres', async () => 'never', { dir, timeoutMs: 500 })).rejects.toThrow(
      `held by process ${process.pid}`,
    );
  });
});
