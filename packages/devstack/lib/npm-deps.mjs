import { createHash } from 'node:crypto';
import { existsSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { inRepo, repoRoot } from './paths.mjs';
import { info } from './log.mjs';
import { run } from './proc.mjs';

const lockfile = inRepo('package-lock.json');
const stampFile = inRepo('node_modules', '.hitchbook-stamp');
// npm writes this hidden lockfile after every successful install, just after package-lock.json.
const npmHiddenLockfile = inRepo('node_modules', '.package-lock.json');

function currentStamp() {
  const lockHash = createHash('sha256').update(readFileSync(lockfile)).digest('hex');
  return { lockHash, node: process.versions.node.split('.')[0] };
}

function readStamp() {
  try {
    return JSON.parse(readFileSync(stampFile, 'utf8'));
  } catch {
    return null;
  }
}

/** Why node_modules needs `npm ci`, or null when it matches package-lock.json. */
function staleReason(wanted) {
  if (!existsSync(inRepo('node_modules'))) return 'node_modules is missing';
  const stamp = readStamp();
  if (stamp?.lockHash === wanted.lockHash && stamp.node === wanted.node) return null;
  if (stamp?.node && stamp.node !== wanted.node) return `node_modules was installed for Node ${stamp.node}, this is Node ${wanted.node}`;
  // An `npm install` run by hand since the last stamp leaves node_modules current; npm's own record says so.
  if (existsSync(npmHiddenLockfile) && statSync(npmHiddenLockfile).mtimeMs >= statSync(lockfile).mtimeMs) return null;
  return 'package-lock.json changed since the last install';
}

export async function ensureNodeModules() {
  if (!existsSync(lockfile)) throw new Error(`${lockfile} is missing; it is part of the repository`);
  const wanted = currentStamp();
  const reason = staleReason(wanted);
  if (reason) {
    info(`Installing npm packages (${reason})…`);
    await run('npm', ['ci', '--no-audit', '--no-fund'], { cwd: repoRoot });
  } else {
    info('npm packages match package-lock.json');
  }
  writeFileSync(stampFile, `${JSON.stringify(wanted)}\n`);
}
