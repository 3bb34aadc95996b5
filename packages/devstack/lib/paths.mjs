import { fileURLToPath } from 'node:url';
import { join } from 'node:path';

export const repoRoot = fileURLToPath(new URL('../../../', import.meta.url)).replace(/\/$/, '');
export const dataDir = join(repoRoot, '.data');
/** Lock and lease files of the running scripts. */
export const runDir = join(dataDir, 'run');

export function inRepo(...parts) {
  return join(repoRoot, ...parts);
}
