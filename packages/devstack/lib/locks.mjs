import { linkSync, mkdirSync, readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { DevstackError } from './log.mjs';
import { runDir } from './paths.mjs';
import { interruptible, processIsAlive, sleep } from './proc.mjs';

function readJson(path) {
  try {
    return JSON.parse(readFileSync(path, 'utf8'));
  } catch {
    return null;
  }
}

/**
 * Runs `fn` while holding a lock shared by every devstack script, so two of them never set up the same cluster at once.
 * A lock left by a process that died is taken over.
 */
export async function withFileLock(name, fn, { timeoutMs = 180_000, dir = runDir } = {}) {
  mkdirSync(dir, { recursive: true });
  const lockDir = join(dir, `${name}.lock`);
  const ownerFile = join(lockDir, 'owner.json');
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    try {
      mkdirSync(lockDir);
      writeFileSync(ownerFile, JSON.stringify({ pid: process.pid }));
      break;
    } catch (error) {
      if (error.code !== 'EEXIST') throw error;
      const owner = readJson(ownerFile);
      if (owner && !processIsAlive(owner.pid)) {
        rmSync(lockDir, { recursive: true, force: true });
        continue;
      }
      if (Date.now() > deadline) {
        throw new DevstackError(`waited ${timeoutMs / 1000} s for ${lockDir} held by process ${owner?.pid ?? '(starting)'}`);
      }
      await interruptible(sleep(200));
    }
  }
  try {
    return await fn();
  } finally {
    rmSync(lockDir, { recursive: true, force: true });
  }
}

/**
 * Claims `.data/run/<name>.json` for this process unless a live process holds it.
 * Returns { claimed: true, previous, update, release }, where `previous` is what a dead holder left (or null),
 * or { claimed: false, holder } with what the live holder wrote.
 */
export function claimSingleRun(name, details, dir = runDir) {
  mkdirSync(dir, { recursive: true });
  const file = join(dir, `${name}.json`);
  const temp = `${file}.${process.pid}.tmp`;
  const since = new Date().toISOString();
  // Written whole to a private file first, so a reader never sees a half-written claim.
  const writeTemp = (content) => writeFileSync(temp, JSON.stringify({ pid: process.pid, since, ...content }, null, 2));
  let previous = null;
  for (;;) {
    writeTemp(details);
    try {
      linkSync(temp, file);
      rmSync(temp);
      let current = details;
      return {
        claimed: true,
        previous,
        update(extra) {
          current = { ...current, ...extra };
          writeTemp(current);
          renameSync(temp, file);
        },
        release() {
          if (readJson(file)?.pid === process.pid) rmSync(file, { force: true });
        },
      };
    } catch (error) {
      rmSync(temp, { force: true });
      if (error.code !== 'EEXIST') throw error;
      const holder = readJson(file);
      if (holder && processIsAlive(holder.pid)) return { claimed: false, holder };
      previous = holder;
      rmSync(file, { force: true });
    }
  }
}
