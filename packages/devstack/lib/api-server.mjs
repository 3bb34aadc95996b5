import { existsSync } from 'node:fs';
import { DevstackError } from './log.mjs';
import { waitForHttp } from './net.mjs';
import { inRepo, repoRoot } from './paths.mjs';
import { startService } from './proc.mjs';

const API_ENTRY = 'apps/api/dist/main.js';

/** Everything the API process is configured with; `fakesEnv` carries SMTP_* and MAIL_* from the local fakes. */
export function apiEnvironment({ databaseUrl, port, appUrl, jwtSecret, uploadDir, fakesEnv, nodeEnv }) {
  return {
    ...process.env,
    ...fakesEnv,
    DATABASE_URL: databaseUrl,
    PORT: String(port),
    APP_URL: appUrl,
    JWT_SECRET: jwtSecret,
    WEB_DIST: inRepo('apps', 'web', 'dist'),
    UPLOAD_DIR: uploadDir,
    NODE_ENV: nodeEnv,
  };
}

/** Starts the built API and resolves once GET /api/health answers 200. `stdout` is 'inherit' or a file descriptor. */
export async function startApi(env, { stdout = 'inherit', name = 'API' } = {}) {
  if (!existsSync(inRepo(API_ENTRY))) throw new DevstackError(`${API_ENTRY} is missing; the build should have produced it`);
  const service = startService(name, process.execPath, ['--enable-source-maps', inRepo(API_ENTRY)], { cwd: repoRoot, env, stdout });
  try {
    await waitForHttp(`http://127.0.0.1:${env.PORT}/api/health`, { service, timeoutMs: 60_000 });
  } catch (error) {
    await service.stop();
    throw error;
  }
  return service;
}
