#!/usr/bin/env node
// The benchmark at farm-operation scale. Starts the built API in production mode on the scale database,
// warms it up, and measures with autocannon on loopback: the baseline GET /api/health, the lists, the
// year's reports, issuing a 500-entry invoice, a 10,000-row CSV import with the peak memory of an API started
// for it, and the web bundle (bench-bundle.mjs). Every figure is compared with the baseline of the same run, because the
// machine is shared and absolute numbers are noisy. Its speed also drifts within a run, so each figure is measured
// in turns with health checks: under load in alternating slices, one request at a time with a health check before
// each request, and judged by those; the lone baseline rows at the top are shown beside. The reports are measured again on a database with one
// year loaded, to show their time does not grow with the other years. The lists and reports keep their answers
// until the operation's data changes; each is measured again computed afresh (Cache-Control: no-cache), as it
// is after every write, beside the budgeted figure.
//
//   npm run bench [-- --no-bundle]
//   BENCH_DATABASE_URL     ten years (default: hitchbook_scale in the local cluster)
//   BENCH_DATABASE_URL_1Y  one year  (default: hitchbook_scale_1y; skipped when it does not exist)
//   BENCH_PORT             port of the API under test (default: a free one)
//   BENCH_SECONDS          length of each measurement (default 10; shorter only for trying the script out)
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { randomBytes } from 'node:crypto';
import { apiEnvironment, startApi } from '../lib/api-server.mjs';
import { DevstackError } from '../lib/log.mjs';
import { freePort } from '../lib/net.mjs';
import { inRepo } from '../lib/paths.mjs';
import { usePostgres } from '../lib/pg-session.mjs';
import { enterCleanup, installSignalHandlers, sleep } from '../lib/proc.mjs';

const require = createRequire(import.meta.url);
const RESULTS_DIR = inRepo('bench-results');
const DURATION = Number(process.env.BENCH_SECONDS ?? 10);
const CONNECTIONS = 50;
const ISSUE_RUNS = 20;
const ISSUE_REFERENCE_REQUESTS = 50;
/** A 50-connection figure and its baseline take turns in this many slices of the run. */
const LOAD_SLICES = 5;
const IMPORT_ROWS = 10_000;
const YEAR = 2025;

/** The budget, as ratios to the same run's baseline. */
const BUDGET = {
  listReqs: 0.5,
  listP99: 2,
  reportP50: 3,
  issueP50: 20,
  importRowsPerSecond: 2000,
  importPeakMb: 300,
  bundle: 1.3,
};

async function loadScaleModule() {
  return import(inRepo('packages/db/dist/scale/accounts.js')).catch(() => {
    throw new DevstackError('packages/db/dist/scale/accounts.js is missing; run npm run build first');
  });
}

// ---------------------------------------------------------------- HTTP

class Client {
  constructor(base, appUrl) {
    this.base = base;
    this.appUrl = appUrl;
  }

  async login(email, password) {
    const res = await fetch(`${this.base}/api/auth/login`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'x-requested-with': 'hitchbook', origin: this.appUrl },
      body: JSON.stringify({ email, password }),
    });
    if (res.status !== 200) throw new DevstackError(`sign-in of ${email} answered ${res.status}: ${await res.text()}`);
    return (await res.json()).accessToken;
  }

  async call(method, path, token, body) {
    return (await this.timedCall(method, path, token, body)).json;
  }

  /**
   * `ms` runs until the answer's last byte has arrived, as every other figure of the benchmark does (autocannon
   * and the health checks read the bytes and parse nothing); reading the JSON is the client's work, done after.
   */
  async timedCall(method, path, token, body) {
    const started = performance.now();
    const res = await fetch(`${this.base}${path}`, {
      method,
      headers: { authorization: `Bearer ${token}`, ...(body ? { 'content-type': 'application/json' } : {}) },
      body: body ? JSON.stringify(body) : undefined,
    });
    const bytes = await res.arrayBuffer();
    const ms = performance.now() - started;
    const text = new TextDecoder().decode(bytes);
    if (res.status >= 300) throw new DevstackError(`${method} ${path} answered ${res.status}: ${text.slice(0, 400)}`);
    return { ms, json: text ? JSON.parse(text) : null };
  }
}

/** A signed-in account whose access token (10 minutes) is renewed before it runs out. */
function account(client, email, password) {
  let token = null;
  let at = 0;
  return async () => {
    if (!token || Date.now() - at > 5 * 60_000) {
      token = await client.login(email, password);
      at = Date.now();
    }
    return token;
  };
}

/**
 * autocannon stops sending when the time is up but the API still works off what it had accepted; the next
 * measurement starts only once a single health request answers again, so one figure never pays for another.
 */
async function settle(base) {
  const until = Date.now() + 60_000;
  await sleep(500);
  while (Date.now() < until) {
    const started = performance.now();
    const res = await fetch(`${base}/api/health`).catch(() => null);
    if (res?.ok && performance.now() - started < 200) return;
    await sleep(250);
  }
}

/**
 * One connection, one request after another, each timed to the microsecond: autocannon's latencies are whole
 * milliseconds, and a sub-millisecond baseline would round to 0 and make every ratio to it meaningless.
 * With `baseline`, a request to it goes before each measured one and the row keeps the p50 of those as its
 * own reference: a loopback round trip on a shared machine drifts by half its length within a minute, so a
 * baseline taken once at the start would judge later rows by another moment's speed.
 */
async function sequential(url, { duration, token, fresh, baseline }) {
  const headers = requestHeaders(token, fresh);
  const times = [];
  const reference = [];
  const until = performance.now() + duration * 1000;
  while (performance.now() < until) {
    if (baseline) reference.push(await timedGet(baseline, ACCEPTS));
    times.push(await timedGet(url, headers));
  }
  const sorted = [...times].sort((a, b) => a - b);
  const figures = { requests: times.length, reqPerSec: times.length / duration, p50: median(times), p99: sorted[Math.min(sorted.length - 1, Math.floor(sorted.length * 0.99))] };
  return baseline ? { ...figures, referenceP50: median(reference) } : figures;
}

async function timedGet(url, headers) {
  const started = performance.now();
  const res = await fetch(url, { headers });
  await res.arrayBuffer();
  if (!res.ok) throw new DevstackError(`${url}: answered ${res.status}`);
  return performance.now() - started;
}

/** What every browser sends, and Node's fetch too: the API gzips the answers it keeps for clients that accept it. */
const ACCEPTS = { 'accept-encoding': 'gzip, deflate, br' };

/** `fresh` asks for the answer computed afresh instead of the one the API keeps until the data changes. */
function requestHeaders(token, fresh) {
  return { ...ACCEPTS, ...(token ? { authorization: `Bearer ${token}` } : {}), ...(fresh ? { 'cache-control': 'no-cache' } : {}) };
}

async function cannon(url, { connections, duration, token, fresh, baseline }) {
  if (connections === 1) return sequential(url, { duration, token, fresh, baseline });
  if (baseline) return inSlices(url, { connections, duration, token, fresh, baseline });
  return loaded(url, { connections, duration, headers: requestHeaders(token, fresh) });
}

async function loaded(url, { connections, duration, headers }) {
  const autocannon = require('autocannon');
  const result = await autocannon({ url, connections, duration, timeout: 30, headers });
  await settle(new URL(url).origin);
  const bad = result.non2xx + result.errors + result.timeouts;
  if (bad > 0) throw new DevstackError(`${url}: ${result.non2xx} non-2xx answers, ${result.errors} errors, ${result.timeouts} timeouts`);
  if (result.requests.total === 0) throw new DevstackError(`${url}: no answer within ${duration} s`);
  return { requests: result.requests.total, reqPerSec: result.requests.average, p50: result.latency.p50, p99: result.latency.p99 };
}

/**
 * Under load, the same idea as `sequential` with a baseline: the measured route and the baseline take turns in
 * slices of the run, so both meet the same moments of a shared machine. Rates are the requests of all slices over
 * their time; latencies are the median of the slices' own.
 */
async function inSlices(url, { connections, duration, token, fresh, baseline }) {
  const slice = duration / LOAD_SLICES;
  const ours = [];
  const theirs = [];
  for (let i = 0; i < LOAD_SLICES; i++) {
    theirs.push(await loaded(baseline, { connections, duration: slice, headers: ACCEPTS }));
    ours.push(await loaded(url, { connections, duration: slice, headers: requestHeaders(token, fresh) }));
  }
  const combine = (runs) => ({
    requests: runs.reduce((sum, r) => sum + r.requests, 0),
    reqPerSec: runs.reduce((sum, r) => sum + r.reqPerSec, 0) / runs.length,
    p50: median(runs.map((r) => r.p50)),
    p99: median(runs.map((r) => r.p99)),
  });
  return { ...combine(ours), reference: combine(theirs) };
}

const median = (values) => {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
};

// ---------------------------------------------------------------- the measured API

async function withApi(databaseUrl, port, fn) {
  const uploadDir = mkdtempSync(join(tmpdir(), 'hitchbook-bench-uploads-'));
  const appUrl = `http://localhost:${port}`;
  const env = apiEnvironment({ databaseUrl, port, appUrl, jwtSecret: randomBytes(32).toString('hex'), uploadDir, fakesEnv: {}, nodeEnv: 'production' });
  const service = await startApi(env, { stdout: 'ignore', name: 'API under benchmark' });
  try {
    return await fn(new Client(`http://127.0.0.1:${port}`, appUrl), service.child.pid);
  } finally {
    await service.stop();
    rmSync(uploadDir, { recursive: true, force: true });
  }
}

/** Ids the routes are measured with, read once from the scale database. */
async function scaleIds(databaseUrl, scale) {
  const pg = require('pg');
  const client = new pg.Client({ connectionString: databaseUrl });
  await client.connect();
  try {
    const email = scale.scaleEmail('a', 'owner');
    const one = async (text, params) => {
      const { rows } = await client.query(text, params);
      if (rows.length === 0) throw new DevstackError(`the scale database lacks what the benchmark needs (${text.slice(0, 60)}…); generate it with npm run db:seed:scale`);
      return rows;
    };
    const [{ operation_id: operationId }] = await one(`select m.operation_id from memberships m join users u on u.id = m.user_id where lower(u.email) = $1`, [email]);
    const [{ id: machineId }] = await one(`select id from machines where operation_id = $1 and kind = 'power' order by unit_number limit 1`, [operationId]);
    const [{ id: squareUpId }] = await one(`select id from square_ups where operation_id = $1 and period_from = $2`, [operationId, `${YEAR}-01-01`]);
    const [{ id: benchCustomer }] = await one(`select p.id from memberships m join users u on u.id = m.user_id join parties p on p.id = m.party_id where lower(u.email) = $1`, [scale.scaleEmail('a', 'customer0')]);
    const fields = (await one(`select name from fields where operation_id = $1 and archived_at is null order by name`, [operationId])).map((r) => r.name);
    const workTypes = (await one(`select name from work_types where operation_id = $1 and not archived order by key`, [operationId])).map((r) => r.name);
    const power = (await one(`select name from machines where operation_id = $1 and kind = 'power' order by name`, [operationId])).map((r) => r.name);
    const households = (await one(`select name from parties where operation_id = $1 and kind = 'household' order by name`, [operationId])).map((r) => r.name);
    return { operationId, machineId, squareUpId, benchCustomer, fields, workTypes, power, households };
  } finally {
    await client.end();
  }
}

async function deleteImported(databaseUrl, operationId, marker) {
  const pg = require('pg');
  const client = new pg.Client({ connectionString: databaseUrl });
  await client.connect();
  try {
    await client.query(`delete from meter_readings where operation_id = $1 and work_entry_id in (select id from work_entries where operation_id = $1 and notes like $2)`, [operationId, `${marker}%`]);
    const { rowCount } = await client.query(`delete from work_entries where operation_id = $1 and notes like $2`, [operationId, `${marker}%`]);
    return rowCount;
  } finally {
    await client.end();
  }
}

// ---------------------------------------------------------------- the figures

function reportPaths(ids) {
  return {
    machineRates: `/api/reports/machine-rates?year=${YEAR}`,
    squareUp: `/api/square-ups/${ids.squareUpId}/statement`,
  };
}

async function measureHttp(client, ids, scale, log) {
  const password = scale.SCALE_PASSWORD;
  const owner = account(client, scale.scaleEmail('a', 'owner'), password);
  const customer = account(client, scale.scaleEmail('a', 'customer1'), password);
  const base = client.base;
  const reports = reportPaths(ids);
  const routes = [
    { key: 'baseline', label: 'GET /api/health (baseline)', path: '/api/health', connections: CONNECTIONS },
    { key: 'baseline1', label: 'GET /api/health, 1 connection', path: '/api/health', connections: 1 },
    { key: 'workEntries', label: 'work entries: year + machine, 50 by date', path: `/api/work-entries?dateFrom=${YEAR}-01-01&dateTo=${YEAR}-12-31&machineId=${ids.machineId}&sort=-date&pageSize=50`, connections: CONNECTIONS, who: owner, budget: 'list' },
    { key: 'invoices', label: 'invoices list', path: '/api/invoices?pageSize=50', connections: CONNECTIONS, who: owner, budget: 'list' },
    { key: 'customerInvoices', label: "customer's invoice list", path: '/api/invoices?pageSize=50', connections: CONNECTIONS, who: customer, budget: 'list' },
    { key: 'machineRates', label: `machine-rates report ${YEAR}, 1 connection`, path: reports.machineRates, connections: 1, who: owner, budget: 'report' },
    { key: 'squareUp', label: `square-up statement ${YEAR}, 1 connection`, path: reports.squareUp, connections: 1, who: owner, budget: 'report' },
  ];
  // The same reads computed afresh on every request, as after each write: shown beside the budget, not judged.
  for (const r of routes.filter((route) => route.budget)) {
    routes.push({ ...r, key: `${r.key}Fresh`, label: `${r.label}, computed afresh`, budget: null, fresh: true });
  }
  log('Warming up');
  for (const r of routes) await cannon(`${base}${r.path}`, { connections: Math.min(r.connections, 10), duration: 2, token: r.who ? await r.who() : null, fresh: r.fresh });
  const figures = {};
  for (const r of routes) {
    log(`Measuring ${r.label} (${r.connections} connection${r.connections > 1 ? 's' : ''}, ${DURATION} s)`);
    const baseline = r.key.startsWith('baseline') ? undefined : `${base}/api/health`;
    figures[r.key] = { label: r.label, connections: r.connections, budget: r.budget ?? null, ...(await cannon(`${base}${r.path}`, { connections: r.connections, duration: DURATION, token: r.who ? await r.who() : null, fresh: r.fresh, baseline })) };
  }
  figures.issue = await measureIssue(client, ids, scale, owner, log);
  return figures;
}

/** Sequential: a draft over a fresh week of 500 approved entries, then its issue timed; voided afterwards so the entries stay billable for the next run. */
async function measureIssue(client, ids, scale, owner, log) {
  log(`Measuring invoice issue of ${scale.BENCH_BATCH_ENTRIES} entries (${ISSUE_RUNS} runs, sequential)`);
  const issueMs = [];
  const draftMs = [];
  const reference = [];
  for (let run = 0; run <= ISSUE_RUNS; run++) {
    const { from, to } = scale.benchBatchRange(run % scale.BENCH_BATCHES);
    const token = await owner();
    const { ms: drafted, json: draft } = await client.timedCall('POST', '/api/invoices/drafts', token, { partyId: ids.benchCustomer, from, to });
    const billed = draft.lines.filter((l) => l.workEntryId).length;
    if (billed !== scale.BENCH_BATCH_ENTRIES) throw new DevstackError(`the draft for ${from}..${to} bills ${billed} entries, not ${scale.BENCH_BATCH_ENTRIES}; regenerate the scale database`);
    // The run's own reference: health checks sent just before the issue, one after the other.
    const before = [];
    for (let i = 0; i < ISSUE_REFERENCE_REQUESTS; i++) before.push(await timedGet(`${client.base}/api/health`, {}));
    // A draft holds its entries: one left behind by a failed issue would leave the next run nothing to bill.
    const { ms: issued } = await client.timedCall('POST', `/api/invoices/${draft.id}/issue`, token, {}).catch(async (err) => {
      await client.call('DELETE', `/api/invoices/${draft.id}`, token);
      throw err;
    });
    await client.call('POST', `/api/invoices/${draft.id}/void`, token, { reason: 'Benchmark run: entries released for the next run' });
    // The first run warms the route up and is not counted.
    if (run > 0) {
      issueMs.push(issued);
      draftMs.push(drafted);
      reference.push(...before);
    }
  }
  return { label: `issue a ${scale.BENCH_BATCH_ENTRIES}-entry invoice, sequential`, connections: 1, budget: 'issue', runs: ISSUE_RUNS, p50: median(issueMs), p99: Math.max(...issueMs), draftP50: median(draftMs), referenceP50: median(reference), reqPerSec: null };
}

function importCsv(ids, scale, marker) {
  const quote = (s) => (/[",\n]/.test(s) ? `"${s.replaceAll('"', '""')}"` : s);
  const lines = ['date,field,work type,power unit,operator email,hours,acres,loads,bill to,notes'];
  for (let i = 0; i < IMPORT_ROWS; i++) {
    const day = new Date(Date.UTC(scale.BENCH_YEAR, 6, 1) + (i % 150) * 86_400_000).toISOString().slice(0, 10);
    lines.push(
      [day, ids.fields[i % ids.fields.length], ids.workTypes[i % ids.workTypes.length], ids.power[i % ids.power.length], scale.scaleEmail('a', `operator${i % 12}`), (1 + (i % 80) / 10).toFixed(1), (10 + (i % 300) / 10).toFixed(1), String(1 + (i % 9)), ids.households[i % ids.households.length], `${marker} row ${i + 1}`]
        .map(quote)
        .join(','),
    );
  }
  return `${lines.join('\n')}\n`;
}

function rssMb(pid) {
  try {
    const status = readFileSync(`/proc/${pid}/status`, 'utf8');
    return Number(/VmRSS:\s+(\d+)/.exec(status)[1]) / 1024;
  } catch {
    return 0;
  }
}

async function measureImport(client, ids, scale, apiPid, log) {
  const marker = `Benchmark import ${Date.now()}`;
  const csv = importCsv(ids, scale, marker);
  log(`Measuring CSV import of ${IMPORT_ROWS} rows (${(csv.length / 1024 / 1024).toFixed(1)} MiB)`);
  const token = await client.login(scale.scaleEmail('a', 'owner'), scale.SCALE_PASSWORD);
  let peak = rssMb(apiPid);
  const before = peak;
  const sampler = setInterval(() => {
    peak = Math.max(peak, rssMb(apiPid));
  }, 20);
  const form = new FormData();
  form.append('file', new Blob([csv], { type: 'text/csv' }), 'bench-entries.csv');
  const started = performance.now();
  const res = await fetch(`${client.base}/api/work-entries/import?kind=entries&mode=commit`, { method: 'POST', headers: { authorization: `Bearer ${token}` }, body: form });
  const seconds = (performance.now() - started) / 1000;
  clearInterval(sampler);
  peak = Math.max(peak, rssMb(apiPid));
  const body = await res.json();
  if (res.status >= 300) throw new DevstackError(`the CSV import answered ${res.status}: ${JSON.stringify(body).slice(0, 600)}`);
  return { rows: IMPORT_ROWS, seconds, rowsPerSecond: IMPORT_ROWS / seconds, rssBeforeMb: before, peakRssMb: peak, marker, answer: { status: res.status, ...Object.fromEntries(Object.entries(body).filter(([, v]) => typeof v !== 'object')) } };
}

// ---------------------------------------------------------------- the table

const fmt = (n, digits = 1) => (n === null || n === undefined ? '—' : Number(n).toFixed(digits));
const mark = (ok) => (ok ? 'met' : 'NOT met');

function judge(figures) {
  const b = figures.baseline;
  const b1 = figures.baseline1;
  const rows = [];
  for (const f of Object.values(figures)) {
    const ref = f.connections === 1 ? b1 : b;
    // A row measured in turns with health checks is judged by those; the run's lone baseline is shown beside it.
    const row = {
      ...f,
      reqRatio: f.reference ? f.reqPerSec / f.reference.reqPerSec : f.referenceP50 ? null : f.reqPerSec / ref.reqPerSec,
      p50Ratio: f.p50 / (f.reference?.p50 ?? f.referenceP50 ?? ref.p50),
      p99Ratio: f.p99 / (f.reference?.p99 ?? ref.p99),
      verdict: '',
    };
    if (f.reference) row.toLoneBaseline = { reqRatio: f.reqPerSec / b.reqPerSec, p99Ratio: f.p99 / b.p99 };
    if (f.referenceP50) row.toLoneBaseline = { p50Ratio: f.p50 / b1.p50 };
    if (f.budget === 'list') row.verdict = `${mark(row.reqRatio >= BUDGET.listReqs && row.p99Ratio <= BUDGET.listP99)} (req/s >= ${BUDGET.listReqs}x, p99 <= ${BUDGET.listP99}x)`;
    if (f.budget === 'report') row.verdict = `${mark(row.p50Ratio <= BUDGET.reportP50)} (p50 <= ${BUDGET.reportP50}x)`;
    if (f.budget === 'issue') row.verdict = `${mark(row.p50Ratio <= BUDGET.issueP50)} (p50 <= ${BUDGET.issueP50}x)`;
    rows.push(row);
  }
  return rows;
}

/** The baseline a row was measured in turns with: its req/s under load, its p50 one request at a time. */
function referenceOf(row) {
  if (row.reference) return `${fmt(row.reference.reqPerSec, 0)}/s`;
  if (row.referenceP50) return `${fmt(row.referenceP50, 2)} ms`;
  return '—';
}

function printTable(rows) {
  const header = ['', 'conn', 'req/s', 'p50 ms', 'p99 ms', 'ref', 'req/s ×', 'p50 ×', 'p99 ×', 'budget'];
  const widths = [62, 5, 9, 8, 8, 10, 8, 7, 7, 0];
  const line = (cells) => cells.map((c, i) => (i === 0 ? String(c).padEnd(widths[i]) : i === cells.length - 1 ? String(c) : String(c).padStart(widths[i]))).join(' ');
  console.log(line(header));
  for (const r of rows) console.log(line([r.label, r.connections, fmt(r.reqPerSec, 0), fmt(r.p50, 2), fmt(r.p99, 2), referenceOf(r), fmt(r.reqRatio, 2), fmt(r.p50Ratio, 2), fmt(r.p99Ratio, 2), r.verdict]));
}

// ---------------------------------------------------------------- main

async function databaseExists(postgres, url) {
  const pg = require('pg');
  const client = new pg.Client({ connectionString: url });
  try {
    await client.connect();
    await client.end();
    return true;
  } catch {
    return false;
  }
}

async function main(args) {
  const skipBundle = args.includes('--no-bundle');
  const scale = await loadScaleModule();
  const log = (m) => console.log(`· ${m}`);
  let postgres = null;
  if (!process.env.BENCH_DATABASE_URL || !process.env.BENCH_DATABASE_URL_1Y) postgres = await usePostgres('bench.mjs');
  try {
    const url10 = process.env.BENCH_DATABASE_URL ?? postgres.url('hitchbook_scale');
    const url1 = process.env.BENCH_DATABASE_URL_1Y ?? postgres.url('hitchbook_scale_1y');
    const port = process.env.BENCH_PORT ? Number(process.env.BENCH_PORT) : await freePort();
    if (!(await databaseExists(postgres, url10))) throw new DevstackError('the scale database does not exist; generate it with npm run db:seed:scale');
    const ids = await scaleIds(url10, scale);

    console.log(`Benchmark on ${new URL(url10).pathname.slice(1)} (ten years), API in production mode on port ${port}`);
    const figures = await withApi(url10, port, (client) => measureHttp(client, ids, scale, log));
    // On an API of its own, so the peak is the import's and not what 50-connection load left in the heap.
    const csv = await withApi(url10, port, (client, pid) => measureImport(client, ids, scale, pid, log));
    const removed = await deleteImported(url10, ids.operationId, csv.marker);
    log(`Removed the ${removed} imported rows again`);

    let growth = null;
    if (await databaseExists(postgres, url1)) {
      console.log(`Reports again on ${new URL(url1).pathname.slice(1)} (one year)`);
      const ids1 = await scaleIds(url1, scale);
      growth = await withApi(url1, port, async (client) => {
        const owner = account(client, scale.scaleEmail('a', 'owner'), scale.SCALE_PASSWORD);
        const reports = reportPaths(ids1);
        const out = {};
        const measured = [['machineRates', reports.machineRates], ['squareUp', reports.squareUp], ['machineRatesFresh', reports.machineRates, true], ['squareUpFresh', reports.squareUp, true]];
        for (const [key, path, fresh] of measured) {
          const token = await owner();
          await cannon(`${client.base}${path}`, { connections: 1, duration: 2, token, fresh });
          log(`Measuring ${key} on one year (1 connection, ${DURATION} s)`);
          out[key] = await cannon(`${client.base}${path}`, { connections: 1, duration: DURATION, token, fresh, baseline: `${client.base}/api/health` });
        }
        return out;
      });
    }

    let bundle = null;
    if (!skipBundle) {
      log('Building the web bundle figures');
      try {
        const { measureBundles } = await import('./bench-bundle.mjs');
        bundle = await measureBundles();
      } catch (error) {
        console.log(`  web bundle: not measured (${error.message})`);
      }
    }

    const rows = judge(figures);
    console.log('\nHTTP, ratios to GET /api/health measured in turns with each row ("ref": its req/s in the slices between the row\'s own, or its p50 between the row\'s requests)');
    printTable(rows);
    console.log('  against the lone baseline rows at the top instead:');
    for (const r of rows.filter((row) => row.budget && row.toLoneBaseline)) {
      const { reqRatio, p50Ratio, p99Ratio } = r.toLoneBaseline;
      console.log(`    ${r.label.padEnd(58)} ${reqRatio === undefined ? `p50 ${fmt(p50Ratio, 2)}x` : `req/s ${fmt(reqRatio, 2)}x, p99 ${fmt(p99Ratio, 2)}x`}`);
    }
    console.log(`  draft of the ${scale.BENCH_BATCH_ENTRIES}-entry invoice (not budgeted): p50 ${fmt(figures.issue.draftP50)} ms`);
    if (growth) {
      console.log('\nYear reports with one year loaded against ten (p50 ms at 1 connection; ratio to the health checks sent between its requests)');
      for (const key of ['machineRates', 'squareUp', 'machineRatesFresh', 'squareUpFresh']) {
        const ten = figures[key];
        const one = growth[key];
        console.log(
          `  ${ten.label.padEnd(44)} 1 year ${fmt(one.p50).padStart(6)} ms (${fmt(one.p50 / one.referenceP50, 2)}x)   10 years ${fmt(ten.p50).padStart(6)} ms (${fmt(ten.p50 / ten.referenceP50, 2)}x)`,
        );
      }
    } else {
      console.log('\nOne-year comparison: not measured (create the database and run DATABASE_URL=<its url> npm run db:seed:scale -- --years 1, or set BENCH_DATABASE_URL_1Y)');
    }
    console.log(
      `\nCSV import: ${IMPORT_ROWS} rows in ${fmt(csv.seconds, 2)} s = ${fmt(csv.rowsPerSecond, 0)} rows/s, API peak RSS ${fmt(csv.peakRssMb, 0)} MB (before ${fmt(csv.rssBeforeMb, 0)} MB): ${mark(csv.rowsPerSecond >= BUDGET.importRowsPerSecond && csv.peakRssMb < BUDGET.importPeakMb)} (>= ${BUDGET.importRowsPerSecond} rows/s, < ${BUDGET.importPeakMb} MB)`,
    );
    if (bundle) {
      const r = (n) => n / bundle.bare;
      console.log(
        `Web bundle (gzip JS): bare ${(bundle.bare / 1024).toFixed(1)} KiB, sign-in ${(bundle.signIn / 1024).toFixed(1)} KiB (${fmt(r(bundle.signIn), 2)}x), cab form ${(bundle.cabForm / 1024).toFixed(1)} KiB (${fmt(r(bundle.cabForm), 2)}x): ${mark(r(bundle.signIn) <= BUDGET.bundle && r(bundle.cabForm) <= BUDGET.bundle)} (<= ${BUDGET.bundle}x)`,
      );
      console.log(
        `  as the API sends them (Brotli): bare ${(bundle.brotli.bare / 1024).toFixed(1)} KiB, sign-in ${(bundle.brotli.signIn / 1024).toFixed(1)} KiB, cab form ${(bundle.brotli.cabForm / 1024).toFixed(1)} KiB (not budgeted)`,
      );
    } else {
      console.log('Web bundle: not measured');
    }

    mkdirSync(RESULTS_DIR, { recursive: true });
    const stamp = new Date().toISOString().replace(/[:.]/g, '-');
    const out = { at: new Date().toISOString(), database: new URL(url10).pathname.slice(1), budget: BUDGET, http: rows, oneYear: growth, csvImport: csv, bundle };
    const file = join(RESULTS_DIR, `bench-${stamp}.json`);
    writeFileSync(file, `${JSON.stringify(out, null, 2)}\n`);
    writeFileSync(join(RESULTS_DIR, 'latest.json'), `${JSON.stringify(out, null, 2)}\n`);
    console.log(`\nWritten to ${file.replace(`${inRepo()}/`, '')}`);
  } finally {
    enterCleanup();
    if (postgres) await postgres.release();
  }
}

installSignalHandlers();
main(process.argv.slice(2)).then(
  () => process.exit(0),
  (error) => {
    if (error.details) console.error(error.details.trimEnd());
    console.error(`✗ ${error.message}`);
    process.exit(1);
  },
);
