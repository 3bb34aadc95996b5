#!/usr/bin/env node
// npm start: the whole product on this machine. npm run dev (--dev): the same with Vite's dev server in front of the API.
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { apiEnvironment, startApi } from '../lib/api-server.mjs';
import { startWatchedApi } from '../lib/api-watch.mjs';
import { buildAll } from '../lib/build.mjs';
import { runDatabaseScript } from '../lib/database.mjs';
import { startLocalFakes } from '../lib/local-fakes.mjs';
import { claimSingleRun } from '../lib/locks.mjs';
import { DevstackError, Interrupted, info, printTimings, step, warn } from '../lib/log.mjs';
import { envPort, requireFreePorts, waitForHttp } from '../lib/net.mjs';
import { dataDir, inRepo } from '../lib/paths.mjs';
import { createDatabase } from '../lib/pg.mjs';
import { usePostgres } from '../lib/pg-session.mjs';
import { describeExit, enterCleanup, installSignalHandlers, startService, stopLeftover, untilInterrupted } from '../lib/proc.mjs';
import { ensureNodeModules } from '../lib/npm-deps.mjs';
import { localSecrets } from '../lib/secrets.mjs';

const DATABASE = 'hitchbook';
const DEMO_SIGN_INS = [
  'owner@hitchbook.test',
  'partner@hitchbook.test',
  'operator@hitchbook.test',
  'bookkeeper@hitchbook.test',
  'customer@hitchbook.test',
  'customer2@hitchbook.test',
];
const DEMO_PASSWORD = 'hitchbook-demo';

function parseArgs(args) {
  const unknown = args.filter((a) => a !== '--dev');
  if (unknown.length > 0) throw new DevstackError(`unknown option ${unknown.join(' ')}; the only option is --dev`);
  return { dev: args.includes('--dev') };
}

function readPorts(dev) {
  const port = envPort('PORT', 3000);
  const apiPort = dev ? envPort('API_PORT', 3001) : port;
  const mailSmtp = envPort('MAIL_SMTP_PORT', 1025);
  const mailWeb = envPort('MAIL_WEB_PORT', 1080);
  const wanted = [
    { port, purpose: dev ? 'Vite dev server' : 'web app and API', variable: 'PORT' },
    { port: mailSmtp, purpose: 'mail catcher SMTP', variable: 'MAIL_SMTP_PORT' },
    { port: mailWeb, purpose: 'mail catcher web inbox', variable: 'MAIL_WEB_PORT' },
  ];
  if (dev) wanted.push({ port: apiPort, purpose: 'API', variable: 'API_PORT' });
  const distinct = new Set(wanted.map((w) => w.port));
  if (distinct.size !== wanted.length) throw new DevstackError(`two services would share a port: ${wanted.map((w) => `${w.variable}=${w.port}`).join(', ')}`);
  return { port, apiPort, wanted };
}

/** An earlier run killed outright (kill -9, a closed laptop lid) leaves its services holding the ports. */
async function stopLeftoversOf(previous) {
  for (const record of previous?.services ?? []) {
    if (await stopLeftover(record)) info(`Stopped the ${record.name} (pid ${record.pid}) left by an earlier run that was killed`);
  }
}

/** Resolves with a reason when one of the services exits on its own. */
function firstUnexpectedExit(services) {
  return Promise.race(services.map((s) => s.exited.then((exit) => `${s.name} ${describeExit(exit)}`)));
}

async function main() {
  const { dev } = parseArgs(process.argv.slice(2));
  const claim = claimSingleRun('start', { mode: dev ? 'dev' : 'start' });
  if (!claim.claimed) {
    const { holder } = claim;
    info(
      `Hitchbook is already running (pid ${holder.pid}, since ${holder.since})${holder.appUrl ? ` at ${holder.appUrl}` : ''}.\n` +
        `Stop it with Ctrl-C in its terminal or "kill ${holder.pid}" before starting it again.`,
    );
    return 0;
  }

  const cleanups = [];
  let exitCode = 0;
  try {
    await stopLeftoversOf(claim.previous);
    const { port, apiPort, wanted } = readPorts(dev);
    await requireFreePorts(wanted);
    await step('npm packages', ensureNodeModules);
    const postgres = await step('PostgreSQL', async () => {
      const session = await usePostgres(dev ? 'npm run dev' : 'npm start');
      cleanups.push(async () => {
        const outcome = await session.release();
        info(outcome === 'stopped' ? 'PostgreSQL stopped' : 'PostgreSQL left running for the other scripts using it');
      });
      await createDatabase(DATABASE);
      return session;
    });
    const url = postgres.url(DATABASE);
    await step('Build', buildAll);
    await step(`Migrate database ${DATABASE}`, () => runDatabaseScript('migrate', url));
    await step('Seed the demo outfit', () => runDatabaseScript('seed', url));
    const fakes = await step('Local fakes', async () => {
      const started = await startLocalFakes({ fixedPorts: true });
      cleanups.push(() => Promise.all(started.services.map((s) => s.stop())));
      return started;
    });

    const appUrl = process.env.APP_URL ?? `http://localhost:${port}`;
    const uploadDir = join(dataDir, 'uploads');
    mkdirSync(uploadDir, { recursive: true });
    const env = apiEnvironment({
      databaseUrl: url,
      port: apiPort,
      appUrl,
      jwtSecret: localSecrets().jwtSecret,
      uploadDir,
      fakesEnv: fakes.env,
      nodeEnv: dev ? 'development' : 'production',
    });

    const watched = [...fakes.services];
    const recorded = [...fakes.services];
    if (dev) {
      const api = await step(`API on port ${apiPort} (rebuilt on change)`, () => startWatchedApi(env));
      cleanups.push(() => api.stop());
      recorded.push(...api.services);
      const vite = await step(`Vite dev server on port ${port}`, async () => {
        const service = startService(
          'Vite dev server',
          process.execPath,
          [inRepo('node_modules', 'vite', 'bin', 'vite.js'), '--port', String(port), '--strictPort'],
          { cwd: inRepo('apps', 'web'), env: { ...process.env, PORT: String(port), API_PORT: String(apiPort) } },
        );
        cleanups.push(() => service.stop());
        await waitForHttp(`http://127.0.0.1:${port}/`, { service });
        return service;
      });
      watched.push(vite);
      recorded.push(vite);
    } else {
      const api = await step(`API and web app on port ${port}`, () => startApi(env));
      cleanups.push(() => api.stop());
      watched.push(api);
      recorded.push(api);
    }

    claim.update({ appUrl, services: recorded.map((s) => s.record) });
    printTimings();
    info(
      [
        '',
        `Hitchbook is running${dev ? ' in development mode' : ''}:`,
        `  App:         ${appUrl}`,
        ...fakes.descriptions.map((d) => `  ${d}`),
        `  Demo sign-ins (password ${DEMO_PASSWORD}):`,
        ...DEMO_SIGN_INS.map((email) => `    ${email}`),
        'Press Ctrl-C to stop everything.',
      ].join('\n'),
    );

    const reason = await Promise.race([untilInterrupted().then(() => null), firstUnexpectedExit(watched)]);
    if (reason) {
      warn(`${reason}; stopping everything`);
      exitCode = 1;
    }
  } catch (error) {
    if (error instanceof Interrupted) exitCode = 130;
    else {
      if (!error.reported) {
        if (error.details) console.error(error.details.trimEnd());
        console.error(`✗ ${error.message}`);
      }
      exitCode = 1;
    }
  } finally {
    enterCleanup();
    for (const cleanup of cleanups.reverse()) {
      try {
        await cleanup();
      } catch (error) {
        warn(`while stopping: ${error.message}`);
      }
    }
    claim.release();
  }
  return exitCode;
}

installSignalHandlers();
main().then(
  (code) => process.exit(code),
  (error) => {
    console.error(`✗ ${error.message}`);
    process.exit(1);
  },
);
