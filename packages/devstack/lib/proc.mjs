import { spawn } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { DevstackError, Interrupted } from './log.mjs';

/** Every child runs in its own process group so a stop reaches the whole tree (npm → sh → tsc). */
const liveGroups = new Set();
/** The subset of liveGroups started by run(): short tasks that an interruption simply kills. */
const taskGroups = new Set();
let interruption = null;
let cleaningUp = false;
const interruptWaiters = new Set();

export function installSignalHandlers() {
  for (const signal of ['SIGINT', 'SIGTERM', 'SIGHUP']) {
    process.on(signal, () => {
      // npm forwards the terminal's Ctrl-C as well, so the same interruption often arrives twice.
      if (interruption) return;
      interruption = signal;
      console.error(`\n${signal} received: stopping what was started…`);
      for (const pid of taskGroups) killGroup(pid, 'SIGTERM');
      for (const waiter of interruptWaiters) waiter(signal);
    });
  }
  process.on('exit', () => {
    for (const pid of liveGroups) killGroup(pid, 'SIGKILL');
  });
}

export function isInterrupted() {
  return interruption !== null;
}

/** Resolves with the signal name once the script is asked to stop. */
export function untilInterrupted() {
  if (interruption) return Promise.resolve(interruption);
  return new Promise((resolve) => interruptWaiters.add(resolve));
}

/** From here on the script only stops what it started, and a stop signal no longer cuts waits short. */
export function enterCleanup() {
  cleaningUp = true;
}

/** Settles like `promise`, or rejects with Interrupted as soon as a stop signal arrives (except during clean-up). */
export function interruptible(promise) {
  if (cleaningUp) return promise;
  return Promise.race([promise, untilInterrupted().then((signal) => Promise.reject(new Interrupted(signal)))]);
}

function killGroup(pid, signal) {
  try {
    process.kill(-pid, signal);
  } catch {
    // The group is already gone.
  }
}

export function describeCommand(cmd, args) {
  return [cmd, ...args].map((a) => (/[\s"']/.test(a) ? JSON.stringify(a) : a)).join(' ');
}

/**
 * Runs a command to completion. With `quiet`, output is kept and shown only if the command fails.
 * Resolves with { code, output }; rejects with a DevstackError unless `allowFailure`.
 */
export function run(cmd, args, { cwd, env = process.env, quiet = false, input, allowFailure = false, label } = {}) {
  const what = label ?? describeCommand(cmd, args);
  return interruptible(
    new Promise((resolve, reject) => {
      const child = spawn(cmd, args, {
        cwd,
        env,
        detached: true,
        stdio: [input === undefined ? 'ignore' : 'pipe', quiet ? 'pipe' : 'inherit', quiet ? 'pipe' : 'inherit'],
      });
      let output = '';
      const keep = (chunk) => {
        output += chunk;
      };
      child.stdout?.setEncoding('utf8').on('data', keep);
      child.stderr?.setEncoding('utf8').on('data', keep);
      if (input !== undefined) child.stdin.end(input);
      child.once('spawn', () => {
        liveGroups.add(child.pid);
        taskGroups.add(child.pid);
      });
      child.once('error', (error) => {
        reject(new DevstackError(error.code === 'ENOENT' ? `${cmd} is not installed or not on PATH` : `${what}: ${error.message}`));
      });
      child.once('close', (code, signal) => {
        liveGroups.delete(child.pid);
        taskGroups.delete(child.pid);
        if (code === 0 || allowFailure) return resolve({ code: code ?? 1, output });
        reject(new DevstackError(`${what} ${signal ? `was killed by ${signal}` : `exited with code ${code}`}`, { details: output }));
      });
    }),
  );
}

/**
 * Starts a long-running child. `stdout` is 'inherit', 'pipe' (read it from service.child) or a file descriptor.
 * The returned service knows when it exited and how to stop its whole process group.
 */
export function startService(name, cmd, args, { cwd, env = process.env, stdout = 'inherit' } = {}) {
  const child = spawn(cmd, args, { cwd, env, detached: true, stdio: ['ignore', stdout, stdout] });
  let exitInfo = null;
  const exited = new Promise((resolve) => {
    child.once('error', (error) => {
      exitInfo = { code: 127, signal: null, error };
      resolve(exitInfo);
    });
    child.once('exit', (code, signal) => {
      liveGroups.delete(child.pid);
      exitInfo = { code, signal };
      resolve(exitInfo);
    });
  });
  if (child.pid) liveGroups.add(child.pid);
  return {
    name,
    child,
    exited,
    /** What stopLeftover needs to find this service again if the script that started it is killed. */
    get record() {
      return { name, pid: child.pid, commandLine: processCommandLine(child.pid).join(' ') };
    },
    get exitInfo() {
      return exitInfo;
    },
    /** SIGTERM to the group, SIGKILL if it is still there after `graceMs`. */
    async stop(graceMs = 10_000) {
      if (exitInfo || !child.pid) return;
      killGroup(child.pid, 'SIGTERM');
      const timer = setTimeout(() => killGroup(child.pid, 'SIGKILL'), graceMs);
      await exited;
      clearTimeout(timer);
      // Grandchildren may outlive the leader; they share its group.
      killGroup(child.pid, 'SIGKILL');
    },
  };
}

export function describeExit({ code, signal, error }) {
  if (error) return error.code === 'ENOENT' ? 'could not be started (command not found)' : `could not be started: ${error.message}`;
  return signal ? `was killed by ${signal}` : `exited with code ${code}`;
}

/** True when a process with this id exists and is not a zombie waiting to be reaped. */
export function processIsAlive(pid) {
  if (!Number.isInteger(pid) || pid <= 0) return false;
  try {
    const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
    const state = stat.slice(stat.lastIndexOf(')') + 2, stat.lastIndexOf(')') + 3);
    return state !== 'Z' && state !== 'X';
  } catch {
    return false;
  }
}

export function processCommandLine(pid) {
  try {
    return readFileSync(`/proc/${pid}/cmdline`, 'utf8').split('\0').filter(Boolean);
  } catch {
    return [];
  }
}

/**
 * Stops a process group left behind by a script that was killed outright, if its leader still runs the same command
 * (a reused pid belongs to someone else and is left alone). Returns true when something was stopped.
 */
export async function stopLeftover({ pid, commandLine }) {
  if (!processIsAlive(pid) || processCommandLine(pid).join(' ') !== commandLine) return false;
  killGroup(pid, 'SIGTERM');
  for (let waited = 0; waited < 5_000 && processIsAlive(pid); waited += 100) await sleep(100);
  killGroup(pid, 'SIGKILL');
  return true;
}

export const sleep = (ms) => new Promise((resolve) => setTimeout(resolve, ms));
