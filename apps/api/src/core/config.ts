import { resolve } from 'node:path';

export interface AppConfig {
  databaseUrl: string;
  port: number;
  /** Public base URL used in e-mailed links and for the Origin check on cookie routes. */
  appUrl: string;
  jwtSecret: string;
  accessTokenTtlSeconds: number;
  /** A refresh token not used within this long expires (idle timeout). */
  refreshIdleSeconds: number;
  /** No session outlives this, however often it is refreshed. */
  sessionAbsoluteSeconds: number;
  bcryptCost: number;
  smtpHost: string;
  smtpPort: number;
  mailFrom: string;
  webDist: string | null;
  uploadDir: string;
  production: boolean;
}

export const APP_CONFIG = Symbol('APP_CONFIG');

function requireEnv(env: NodeJS.ProcessEnv, name: string): string {
  const value = env[name];
  if (!value) throw new Error(`${name} is not set.`);
  return value;
}

export function loadConfig(env: NodeJS.ProcessEnv = process.env): AppConfig {
  const port = Number(env.PORT ?? 3000);
  const jwtSecret = requireEnv(env, 'JWT_SECRET');
  if (jwtSecret.length < 32) throw new Error('JWT_SECRET must be at least 32 characters of random data.');
  return {
    databaseUrl: requireEnv(env, 'DATABASE_URL'),
    port,
    appUrl: (env.APP_URL ?? `http://localhost:${port}`).replace(/\/$/, ''),
    jwtSecret,
    accessTokenTtlSeconds: 10 * 60,
    refreshIdleSeconds: 12 * 60 * 60,
    sessionAbsoluteSeconds: 14 * 24 * 60 * 60,
    bcryptCost: 12,
    smtpHost: env.SMTP_HOST ?? '127.0.0.1',
    smtpPort: Number(env.SMTP_PORT ?? 1025),
    mailFrom: env.MAIL_FROM ?? 'Hitchbook <no-reply@hitchbook.test>',
    webDist: env.WEB_DIST ? resolve(env.WEB_DIST) : null,
    uploadDir: resolve(env.UPLOAD_DIR ?? '.data/uploads'),
    production: env.NODE_ENV === 'production',
  };
}
