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
  /** Card payments; null when STRIPE_SECRET_KEY and STRIPE_WEBHOOK_SECRET are not both set. */
  stripe: StripeConfig | null;
  jobs: JobsConfig;
}

export interface StripeConfig {
  secretKey: string;
  webhookSecret: string;
  /** Another Stripe API host (the local fake); null talks to Stripe itself. */
  host: string | null;
  port: number | null;
  protocol: 'http' | 'https';
}

export interface JobsConfig {
  /** PostgreSQL schema of the job queue; instances that share one share their work. */
  schema: string;
  pollingIntervalSeconds: number;
  /** First retry of a failed e-mail after about this long, doubling on each further failure. */
  mailRetryDelaySeconds: number;
  mailRetryLimit: number;
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
    stripe: loadStripeConfig(env),
    jobs: {
      schema: env.JOB_SCHEMA ?? 'pgboss',
      pollingIntervalSeconds: Number(env.JOB_POLL_SECONDS ?? 2),
      mailRetryDelaySeconds: Number(env.MAIL_RETRY_DELAY_SECONDS ?? 20),
      mailRetryLimit: Number(env.MAIL_RETRY_LIMIT ?? 8),
    },
  };
}

const LOOPBACK_HOSTS = new Set(['127.0.0.1', 'localhost', '::1']);

/** Plain http only ever goes to a loopback host (the local fake); anything else is https. */
function loadStripeConfig(env: NodeJS.ProcessEnv): StripeConfig | null {
  const secretKey = env.STRIPE_SECRET_KEY;
  const webhookSecret = env.STRIPE_WEBHOOK_SECRET;
  if (!secretKey || !webhookSecret) return null;
  const host = env.STRIPE_API_HOST || null;
  const port = env.STRIPE_API_PORT ? Number(env.STRIPE_API_PORT) : null;
  if (port !== null && !(Number.isInteger(port) && port > 0 && port < 65536)) throw new Error('STRIPE_API_PORT must be a TCP port number.');
  return { secretKey, webhookSecret, host, port, protocol: host && LOOPBACK_HOSTS.has(host) ? 'http' : 'https' };
}
