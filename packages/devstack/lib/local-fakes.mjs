import { existsSync } from 'node:fs';
import { createInterface } from 'node:readline';
import { DevstackError } from './log.mjs';
import { envPort } from './net.mjs';
import { inRepo, repoRoot } from './paths.mjs';
import { describeExit, interruptible, sleep, startService } from './proc.mjs';

/** The one key the Stripe fake accepts; the fake makes a fresh webhook signing secret on every start. */
const STRIPE_TEST_KEY = 'sk_test_hitchbook_local';

/**
 * Local stand-ins for outside services, started by `npm start` and `npm test` after the build.
 * Each one is a built CLI that prints ready lines; `readyFrom` turns those lines into what `env` hands to the API and tests.
 * `fixedPorts` is true for `npm start` (ports a person can bookmark) and false for `npm test` (free ports).
 */
export const localFakes = [
  {
    name: 'mail catcher',
    tag: 'mail',
    entry: 'packages/mail-catcher/dist/cli.js',
    args: (fixedPorts) => [
      '--host', '127.0.0.1',
      '--smtp', String(fixedPorts ? envPort('MAIL_SMTP_PORT', 1025) : 0),
      '--http', String(fixedPorts ? envPort('MAIL_WEB_PORT', 1080) : 0),
    ],
    readyFrom(lines) {
      const smtp = lines.map((l) => /^SMTP listening on ([^\s:]+):(\d+)$/.exec(l)).find(Boolean);
      const web = lines.map((l) => /^Web inbox at (http:\/\/\S+?)\/?$/.exec(l)).find(Boolean);
      return smtp && web ? { smtpHost: smtp[1], smtpPort: smtp[2], webUrl: web[1] } : null;
    },
    env: ({ smtpHost, smtpPort, webUrl }) => ({
      SMTP_HOST: smtpHost,
      SMTP_PORT: smtpPort,
      MAIL_FROM: 'Hitchbook <no-reply@hitchbook.test>',
      MAIL_WEB_URL: webUrl,
      MAIL_API_URL: webUrl,
    }),
    describe: ({ webUrl, smtpHost, smtpPort }) => `Mail inbox:  ${webUrl}/   (SMTP ${smtpHost}:${smtpPort})`,
  },
  {
    name: 'Stripe fake',
    tag: 'stripe',
    entry: 'packages/stripe-fake/dist/cli.js',
    // npm start knows where the API answers (PORT; under npm run dev, Vite there passes /api on to the API).
    // npm test starts its API later on a free port, so its tests point the fake there with PUT /_fake/webhook-endpoint.
    args: (fixedPorts) => [
      '--host', '127.0.0.1',
      '--port', String(fixedPorts ? envPort('STRIPE_FAKE_PORT', 12111) : 0),
      '--secret-key', STRIPE_TEST_KEY,
      ...(fixedPorts ? ['--webhook-url', `http://127.0.0.1:${envPort('PORT', 3000)}/api/payments/stripe-webhook`] : []),
    ],
    readyFrom(lines) {
      const listening = lines.map((l) => /^Stripe fake listening on ([^\s:]+):(\d+)$/.exec(l)).find(Boolean);
      const base = lines.map((l) => /^Stripe fake at (http:\/\/\S+)$/.exec(l)).find(Boolean);
      const secret = lines.map((l) => /^Webhook signing secret (whsec_\S+)$/.exec(l)).find(Boolean);
      return listening && base && secret ? { host: listening[1], port: listening[2], url: base[1], webhookSecret: secret[1] } : null;
    },
    env: ({ host, port, url, webhookSecret }) => ({
      STRIPE_API_HOST: host,
      STRIPE_API_PORT: port,
      STRIPE_SECRET_KEY: STRIPE_TEST_KEY,
      STRIPE_WEBHOOK_SECRET: webhookSecret,
      STRIPE_FAKE_URL: url,
    }),
    describe: ({ url }) => `Stripe fake: ${url}/_fake   (pay with test card 4242 4242 4242 4242)`,
  },
];

async function startFake(fake, fixedPorts, timeoutMs = 15_000) {
  if (!existsSync(inRepo(fake.entry))) throw new DevstackError(`${fake.entry} is missing; the build should have produced it`);
  const service = startService(fake.name, process.execPath, [inRepo(fake.entry), ...fake.args(fixedPorts)], {
    cwd: repoRoot,
    stdout: 'pipe',
  });
  const lines = [];
  let ready = null;
  const forward = (stream, write) =>
    createInterface({ input: stream }).on('line', (line) => {
      if (ready) write(`[${fake.tag}] ${line}\n`);
      else lines.push(line);
      ready ??= fake.readyFrom(lines);
    });
  forward(service.child.stdout, (text) => process.stdout.write(text));
  forward(service.child.stderr, (text) => process.stderr.write(text));
  const deadline = Date.now() + timeoutMs;
  while (!ready) {
    if (service.exitInfo) {
      throw new DevstackError(`${fake.name} ${describeExit(service.exitInfo)}`, { details: lines.join('\n') });
    }
    if (Date.now() > deadline) {
      await service.stop();
      throw new DevstackError(`${fake.name} printed no ready lines within ${timeoutMs / 1000} s`, { details: lines.join('\n') });
    }
    await interruptible(sleep(50));
  }
  return { service, values: ready };
}

/** Starts every local fake; returns the env they offer, one line each for a person, and their services. */
export async function startLocalFakes({ fixedPorts }) {
  const started = [];
  try {
    for (const fake of localFakes) started.push({ fake, ...(await startFake(fake, fixedPorts)) });
  } catch (error) {
    await Promise.all(started.map((s) => s.service.stop()));
    throw error;
  }
  return {
    env: Object.assign({}, ...started.map((s) => s.fake.env(s.values))),
    descriptions: started.map((s) => s.fake.describe(s.values)),
    services: started.map((s) => s.service),
  };
}
