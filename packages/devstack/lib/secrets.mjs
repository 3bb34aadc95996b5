import { randomBytes } from 'node:crypto';
import { chmodSync, linkSync, mkdirSync, readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { DevstackError } from './log.mjs';
import { dataDir } from './paths.mjs';

const secretsFile = join(dataDir, 'secrets.json');

const GENERATORS = {
  jwtSecret: () => randomBytes(32).toString('hex'),
  postgresPassword: () => randomBytes(24).toString('hex'),
};

/** The local secrets, generated once and kept in .data/secrets.json (mode 600) so sign-ins survive a restart. */
export function localSecrets() {
  const stored = readSecrets();
  const missing = Object.keys(GENERATORS).filter((key) => typeof stored?.[key] !== 'string' || stored[key].length === 0);
  if (missing.length === 0) {
    chmodSync(secretsFile, 0o600);
    return stored;
  }
  const complete = { ...stored };
  for (const key of missing) complete[key] = GENERATORS[key]();
  mkdirSync(dataDir, { recursive: true, mode: 0o755 });
  const temp = `${secretsFile}.${process.pid}.tmp`;
  writeFileSync(temp, `${JSON.stringify(complete, null, 2)}\n`, { mode: 0o600 });
  if (stored) {
    renameSync(temp, secretsFile);
    return complete;
  }
  // Two scripts starting at once on a fresh clone must end up with the same secrets: the first link wins.
  try {
    linkSync(temp, secretsFile);
    return complete;
  } catch (error) {
    if (error.code !== 'EEXIST') throw error;
    return readSecrets();
  } finally {
    rmSync(temp, { force: true });
  }
}

function readSecrets() {
  try {
    return JSON.parse(readFileSync(secretsFile, 'utf8'));
  } catch (error) {
    if (error.code === 'ENOENT') return null;
    throw new DevstackError(`${secretsFile} is unreadable (${error.message}); delete it to generate new secrets`);
  }
}
