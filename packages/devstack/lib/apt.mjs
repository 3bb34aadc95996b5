import { existsSync } from 'node:fs';
import { DevstackError, info } from './log.mjs';
import { run } from './proc.mjs';

const APT_ENV = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
// Another install on the machine holds the dpkg lock for a while; wait for it instead of failing.
const APT_OPTIONS = ['-o', 'DPkg::Lock::Timeout=300'];

async function canSudo() {
  const { code } = await run('sudo', ['-n', 'true'], { quiet: true, allowFailure: true }).catch(() => ({ code: 1 }));
  return code === 0;
}

/**
 * Installs the Debian packages whose files are missing: directly as root, through passwordless sudo otherwise.
 * `needs` lists { path, pkg, purpose }.
 */
export async function ensureDebianPackages(needs) {
  const missing = needs.filter((n) => !existsSync(n.path));
  if (missing.length === 0) return;
  const packages = [...new Set(missing.map((n) => n.pkg))];
  const purposes = missing.map((n) => `${n.purpose} (${n.path})`).join(', ');
  let prefix;
  if (process.getuid() === 0) prefix = [];
  else if (await canSudo()) prefix = ['sudo', '-n'];
  else {
    throw new DevstackError(
      `${purposes} ${missing.length === 1 ? 'is' : 'are'} missing and installing needs root. Run: sudo apt-get install -y ${packages.join(' ')}`,
    );
  }
  info(`Installing ${packages.join(', ')} for ${purposes}…`);
  const apt = (args) => (prefix.length ? run(prefix[0], [...prefix.slice(1), 'apt-get', ...args], { env: APT_ENV }) : run('apt-get', args, { env: APT_ENV }));
  await apt([...APT_OPTIONS, 'update']);
  await apt([...APT_OPTIONS, 'install', '-y', ...packages]);
  const stillMissing = missing.filter((n) => !existsSync(n.path));
  if (stillMissing.length > 0) {
    throw new DevstackError(`apt-get installed ${packages.join(' ')} but ${stillMissing.map((n) => n.path).join(', ')} is still missing`);
  }
}
