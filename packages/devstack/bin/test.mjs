#!/usr/bin/env node
// npm test: build, fresh test databases, local fakes, then every workspace's vitest suite; ends with "N passed, M failed".
import { randomBytes } from 'node:crypto';
import { closeSync, mkdtempSync, openSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { apiEnvironment, startApi } from '../lib/api-server.mjs';
import { ensureDebianPackages } from '../lib/apt.mjs';
import { buildAll } from '../lib/build.mjs';
import { runDatabaseScript } from '../lib/database.mjs';
import { startLocalFakes } from '../lib/local-fakes.mjs';
import { claimSingleRun } from '../lib/locks.mjs';
import { DevstackError, formatSeconds, info, Interrupted, printTimings, recordTiming, step, warn } from '../lib/log.mjs';
import { freePort } from '../lib/net.mjs';
import { ensureNodeModules } from '../lib/npm-deps.mjs';
import { createDatabase, dropDatabase } from '../lib/pg.mjs';
import { usePostgres } from '../lib/pg-session.mjs';
import { enterCleanup, installSignalHandlers } from '../lib/proc.mjs';
import { resultsDir, runWorkspaceTests } from '../lib/vitest-run.mjs';
import { hasTestFiles, listWorkspaces, orderWorkspaces } from '../lib/workspaces.mjs';

/** In this order: pure code first, the browser tests against a running API last. */
const WORKSPACE_ORDER = ['packages/shared', 'packages/mail-catcher', 'packages/db', 'apps/api', 'apps/web', 'tests'];
const E2E_WORKSPACE = 'tests';
const TEST_DATABASE = 'hitchbook_test';
const E2E_DATABASE = 'hitchbook_e2e';
const CHROMIUM = '/usr/bin/chromium';

function budgetMs() {
  const raw = process.env.HB_TEST_BUDGET_MINUTES ?? '27';
  const minutes = Number(raw);
  if (!(minutes > 0)) throw new DevstackError(`HB_TEST_BUDGET_MINUTES must be a positive number of minutes, got "${raw}"`);
  return minutes * 60_000;
}

async function freshDatabases(postgres) {
  for (const name of [TEST_DATABASE, E2E_DATABASE]) {
    await dropDatabase(name);
    await createDatabase(name);
    await runDatabaseScript('migrate', postgres.url(name));
  }
  await runDatabaseScript('seed', postgres.url(E2E_DATABASE));
}

async function clearMail(mailApiUrl) {
  const res = await fetch(`${mailApiUrl}/api/messages`, { method: 'DELETE' }).catch((error) => ({ status: error.message }));
  if (res.status !== 204) warn(`could not clear the mail catcher between workspaces (${res.status})`);
}

/**
 * The Stripe fake starts before the E2E API has a port, so it has nowhere to post its signed events
 * until it is told; a browser test that pays by card needs them to reach this API.
 */
async function pointStripeWebhooksAt(fakesEnv, baseUrl) {
  const res = await fetch(`${fakesEnv.STRIPE_FAKE_URL}/_fake/webhook-endpoint`, {
    method: 'PUT',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ url: `${baseUrl}/api/payments/stripe-webhook`, secret: fakesEnv.STRIPE_WEBHOOK_SECRET }),
  }).catch((error) => ({ ok: false, status: error.message }));
  if (!res.ok) throw new DevstackError(`the Stripe fake did not take the E2E webhook endpoint (${res.status})`);
}

async function startE2eApi({ postgres, fakesEnv, uploadRoot }) {
  const port = await freePort();
  const logPath = join(resultsDir, 'e2e-api.log');
  const log = openSync(logPath, 'w');
  const env = apiEnvironment({
    databaseUrl: postgres.url(E2E_DATABASE),
    port,
    appUrl: `http://127.0.0.1:${port}`,
    jwtSecret: randomBytes(32).toString('hex'),
    uploadDir: join(uploadRoot, 'e2e-api'),
    fakesEnv,
    nodeEnv: 'production',
  });
  try {
    const service = await startApi(env, { stdout: log, name: 'E2E API' });
    const baseUrl = `http://127.0.0.1:${port}`;
    try {
      await pointStripeWebhooksAt(fakesEnv, baseUrl);
    } catch (error) {
      await service.stop();
      throw error;
    }
    info(`E2E API at ${baseUrl}, log in ${logPath}`);
    return { service, baseUrl };
  } catch (error) {
    const tail = readFileSync(logPath, 'utf8').trimEnd().split('\n').slice(-30).join('\n');
    throw new DevstackError(error.message, { details: tail });
  } finally {
    closeSync(log);
  }
}

async function main() {
  const results = [];
  const cleanups = [];
  let setupFailure = null;
  const claim = claimSingleRun('test', {});
  if (!claim.claimed) {
    console.error(`✗ Another npm test is running (pid ${claim.holder.pid}, since ${claim.holder.since}); wait for it or stop it.`);
    console.log('0 passed, 1 failed');
    return 1;
  }
  cleanups.push(() => claim.release());
  const uploadRoot = mkdtempSync(join(tmpdir(), 'hitchbook-test-uploads-'));
  cleanups.push(() => rmSync(uploadRoot, { recursive: true, force: true }));

  try {
    const deadline = Date.now() + budgetMs();
    await step('npm packages', ensureNodeModules);
    const postgres = await step('PostgreSQL', async () => {
      const session = await usePostgres('npm test');
      cleanups.push(async () => {
        if ((await session.release()) === 'stopped') info('PostgreSQL stopped');
      });
      return session;
    });
    await step('Build', buildAll);
    await step(`Fresh databases ${TEST_DATABASE} and ${E2E_DATABASE}`, () => freshDatabases(postgres));
    await step('Chromium and poppler-utils', () =>
      ensureDebianPackages([
        { path: CHROMIUM, pkg: 'chromium', purpose: 'the browser for end-to-end tests' },
        { path: '/usr/bin/pdftotext', pkg: 'poppler-utils', purpose: 'PDF text extraction for invoice tests' },
      ]),
    );
    const fakes = await step('Local fakes', async () => {
      const started = await startLocalFakes({ fixedPorts: false });
      cleanups.push(() => Promise.all(started.services.map((s) => s.stop())));
      started.descriptions.forEach((d) => info(d));
      return started;
    });

    const testEnv = { ...process.env, ...fakes.env };
    // vitest sets NODE_ENV=test itself unless the calling shell already chose one.
    delete testEnv.NODE_ENV;
    Object.assign(testEnv, {
      DATABASE_URL: postgres.url(TEST_DATABASE),
      JWT_SECRET: randomBytes(32).toString('hex'),
      UPLOAD_DIR: join(uploadRoot, 'tests'),
      CHROMIUM_PATH: CHROMIUM,
    });

    for (const workspace of orderWorkspaces(WORKSPACE_ORDER, listWorkspaces())) {
      if (!hasTestFiles(workspace)) {
        results.push({ workspace, passed: 0, failed: 0, note: 'skipped: no test files' });
        continue;
      }
      if (Date.now() > deadline) {
        results.push({ workspace, passed: 0, failed: 1, note: 'not run: the time budget for the whole run was used up' });
        continue;
      }
      const env = { ...testEnv };
      let e2eApi = null;
      if (workspace === E2E_WORKSPACE) {
        try {
          e2eApi = await step('E2E API', () => startE2eApi({ postgres, fakesEnv: fakes.env, uploadRoot }));
        } catch (error) {
          if (error instanceof Interrupted) throw error;
          results.push({ workspace, passed: 0, failed: 1, note: 'not run: the E2E API did not start' });
          continue;
        }
        Object.assign(env, { E2E_BASE_URL: e2eApi.baseUrl, E2E_DATABASE_URL: postgres.url(E2E_DATABASE) });
      }
      await clearMail(fakes.env.MAIL_API_URL);
      console.log(`\n• Tests: ${workspace}`);
      const started = Date.now();
      try {
        const result = await runWorkspaceTests(workspace, env, { deadline });
        const ms = Date.now() - started;
        recordTiming(`Tests: ${workspace}`, ms, result.failed === 0);
        results.push({ workspace, ...result, ms });
        console.log(`${result.failed === 0 ? '✓' : '✗'} ${workspace}: ${result.passed} passed, ${result.failed} failed${result.note ? ` (${result.note})` : ''}`);
      } finally {
        if (e2eApi) await e2eApi.service.stop();
      }
    }
  } catch (error) {
    setupFailure = error;
    if (!(error instanceof Interrupted) && !error.reported) {
      if (error.details) console.error(error.details.trimEnd());
      console.error(`✗ ${error.message}`);
    }
  } finally {
    enterCleanup();
    for (const cleanup of cleanups.reverse()) {
      try {
        await cleanup();
      } catch (error) {
        warn(`while cleaning up: ${error.message}`);
      }
    }
  }

  printTimings();
  if (results.length > 0) {
    console.log('\nWorkspaces:');
    for (const r of results) {
      const time = r.ms === undefined ? '' : `  ${formatSeconds(r.ms)}`;
      console.log(`  ${r.workspace.padEnd(24)} ${String(r.passed).padStart(5)} passed ${String(r.failed).padStart(4)} failed${time}${r.note ? `  (${r.note})` : ''}`);
    }
  }
  if (setupFailure) console.log(`\nNot all tests ran: ${setupFailure instanceof Interrupted ? setupFailure.message : 'the set-up failed (see above)'}.`);
  const passed = results.reduce((sum, r) => sum + r.passed, 0);
  const failed = results.reduce((sum, r) => sum + r.failed, 0) + (setupFailure ? 1 : 0);
  console.log(`${passed} passed, ${failed} failed`);
  if (setupFailure instanceof Interrupted) return 130;
  return failed > 0 ? 1 : 0;
}

installSignalHandlers();
main().then(
  (code) => process.exit(code),
  (error) => {
    console.error(`✗ ${error.message}`);
    console.log('0 passed, 1 failed');
    process.exit(1);
  },
);
