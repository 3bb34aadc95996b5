/**
 * Places where the process can be made to die on purpose, so the fault tests can check what a crash at
 * the worst moment leaves behind. HB_FAULT_KILL_AFTER_COMMIT lists point names (comma-separated); the
 * process kills itself with SIGKILL on reaching one of them. Honoured only when NODE_ENV is "test",
 * so no setting can make a production process crash.
 */
export function killPointAfterCommit(name: string, env: NodeJS.ProcessEnv = process.env): void {
  if (env.NODE_ENV !== 'test' || !env.HB_FAULT_KILL_AFTER_COMMIT) return;
  const points = env.HB_FAULT_KILL_AFTER_COMMIT.split(',').map((p) => p.trim());
  if (points.includes(name)) process.kill(process.pid, 'SIGKILL');
}
