import { randomUUID } from 'node:crypto';
import { eq, sql } from 'drizzle-orm';
import pg from 'pg';
import { createDb, invoiceEntries, invoices, workEntries, type DbHandle } from '@hitchbook/db';
import { runMigrations } from '@hitchbook/db/migrate';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { addEntry, addNeighbourSheet, createBillingWorld, type BillingWorld } from '../modules/invoices/billing-world.fixture.js';
import { ApiProcess } from '../test-support/api-process.js';
import { billingState } from '../test-support/billing-invariants.js';
import { createOperation, FIXTURE_PASSWORD, type OperationFixture } from '../test-support/fixtures.js';
import { waitFor } from '../test-support/poll.js';
import { TempCluster } from '../test-support/temp-cluster.js';

// This file stops and starts PostgreSQL, so it runs its own cluster, never the one other tests share.
let cluster: TempCluster;
let databaseUrl: string;
let dbh: DbHandle;
let api: ApiProcess;
let world: BillingWorld<OperationFixture>;
let token: string;

beforeAll(async () => {
  cluster = await TempCluster.create();
  databaseUrl = await cluster.createDatabase('hitchbook');
  await runMigrations(databaseUrl);
  dbh = createDb(databaseUrl, { max: 2, applicationName: 'hitchbook-test' });
  world = await createBillingWorld(dbh.db, await createOperation(dbh.db, 'Outage outfit'));
  await addNeighbourSheet(dbh.db, world);
  api = new ApiProcess({ databaseUrl });
  await api.start();
  const login = await api.fetch('/api/auth/login', { method: 'POST', body: JSON.stringify({ email: world.fx.members.owner.email, password: FIXTURE_PASSWORD }) });
  expect(login.status).toBe(200);
  token = ((await login.json()) as { accessToken: string }).accessToken;
}, 180_000);

afterAll(async () => {
  await api?.dispose();
  await dbh?.close();
  await cluster?.destroy();
});

/** Sessions holding locks; closed after each case so a failed case cannot block the next. */
const holders: pg.Client[] = [];
afterEach(async () => {
  for (const h of holders.splice(0)) await h.end().catch(() => undefined);
});

let day = 0;
async function draftWithOneEntry(): Promise<{ draftId: string; entryId: string }> {
  day += 1;
  const date = `2025-06-${String(day).padStart(2, '0')}`;
  const entryId = await addEntry(dbh.db, world, { workDate: date, workTypeId: world.workTypes.mowing, fieldId: world.fields.creekBottom, billToPartyId: world.fx.customers[0], hours: '2.00', acres: '10.000' });
  const res = await api.fetch('/api/invoices/drafts', { method: 'POST', token, body: JSON.stringify({ partyId: world.fx.customers[0], from: date, to: date }) });
  expect(res.status).toBe(201);
  return { draftId: ((await res.json()) as { id: string }).id, entryId };
}

const issue = (id: string, key = `issue-${randomUUID()}`) => api.fetch(`/api/invoices/${id}/issue`, { method: 'POST', token, headers: { 'Idempotency-Key': key }, body: '{}' });

/**
 * Holds the audit log against writes so an issue stops at its last step, with its number already taken,
 * and resolves once the API's transaction is seen waiting there.
 */
async function issueHeldAtItsAuditRow(draftId: string) {
  const holder = new pg.Client({ connectionString: databaseUrl });
  holder.on('error', () => undefined);
  await holder.connect();
  await holder.query('begin');
  await holder.query('lock table audit_log in share mode');
  holders.push(holder);
  const answer = issue(draftId);
  // Awaited by the caller; a case that fails before that must not leave an unhandled rejection behind.
  answer.catch(() => undefined);
  // Waiting on the audit log while holding the updated counter row: the number is taken, the issue not done.
  await waitFor('the issue to wait on the held audit log', async () => {
    // Inside a transaction the activity view is read once and kept; a fresh look is asked for each time.
    await holder.query('select pg_stat_clear_snapshot()');
    const { rows } = await holder.query<{ pid: number }>(
      `select a.pid from pg_stat_activity a
       where a.application_name = 'hitchbook-api' and pg_blocking_pids(a.pid) @> array[pg_backend_pid()] and a.query ~* 'audit_log'
         and exists (select 1 from pg_locks l where l.pid = a.pid and l.relation = 'invoice_counters'::regclass and l.mode = 'RowExclusiveLock' and l.granted)`,
    );
    if (rows[0]) return rows[0];
    const seen = await holder.query(`select application_name, state, wait_event_type, pg_blocking_pids(pid) as blockers, pg_backend_pid() as me, left(query, 60) as query from pg_stat_activity where datname = current_database()`);
    throw new Error(JSON.stringify(seen.rows));
  });
  return { answer, holder };
}

/** Still a draft without a number, still holding its entry, as it was before the issue began. */
async function expectNothingHalfDone(draftId: string, entryId: string) {
  const [draft] = await dbh.db.select({ status: invoices.status, number: invoices.number }).from(invoices).where(eq(invoices.id, draftId));
  expect(draft).toEqual({ status: 'draft', number: null });
  expect(await dbh.db.select({ invoiceId: invoiceEntries.invoiceId }).from(invoiceEntries).where(eq(invoiceEntries.workEntryId, entryId))).toEqual([{ invoiceId: draftId }]);
  const [entry] = await dbh.db.select({ state: workEntries.state }).from(workEntries).where(eq(workEntries.id, entryId));
  expect(entry?.state).toBe('invoiced');
}

/** The operation's invoices, payments and entry locks as rows, to compare before and after a fault. */
async function snapshot() {
  const op = world.fx.operationId;
  const rows = async (q: ReturnType<typeof sql>) => (await dbh.db.execute(q)).rows;
  return {
    invoices: await rows(sql`select id, status, number, total, amount_paid, version from invoices where operation_id = ${op} order by id`),
    lines: await rows(sql`select l.id, l.invoice_id, l.work_entry_id, l.amount from invoice_lines l join invoices i on i.id = l.invoice_id where i.operation_id = ${op} order by l.id`),
    payments: await rows(sql`select id, invoice_id, amount, reference from payments where operation_id = ${op} order by id`),
    locks: await rows(sql`select work_entry_id, invoice_id from invoice_entries where operation_id = ${op} order by work_entry_id`),
  };
}

const health = async () => (await api.fetch('/api/health')).status;

describe('database faults', () => {
  it('loses nothing when the API’s connections are terminated in the middle of an issue', async () => {
    const { draftId, entryId } = await draftWithOneEntry();
    const { answer, holder } = await issueHeldAtItsAuditRow(draftId);
    const { rows } = await holder.query<{ terminated: boolean }>(
      `select pg_terminate_backend(pid) as terminated from pg_stat_activity where datname = current_database() and application_name in ('hitchbook-api', 'hitchbook-jobs')`,
    );
    expect(rows.length).toBeGreaterThan(0);
    await holder.query('rollback');
    await holder.end();

    const res = await answer.catch((err: Error) => {
      throw new Error(`no answer (${err.message}); the API wrote:\n${api.log}`);
    });
    expect(res.status).toBe(503);
    expect(await res.text()).not.toMatch(/terminat|stack|postgres/i);
    await expectNothingHalfDone(draftId, entryId);

    // The process lives on and new connections replace the dropped ones.
    expect(api.alive).toBe(true);
    await waitFor('health to answer 200', async () => ((await health()) === 200 ? true : undefined));
    const again = await issue(draftId);
    expect(again.status).toBe(200);
    expect(await again.json()).toMatchObject({ number: 1 });
    expect(await billingState(dbh.db, world.fx.operationId)).toEqual({ numbers: { INV: [1] }, entriesOnTwoInvoices: [], partlyIssued: [], draftsMissingEntries: [] });
  }, 120_000);

  it('keeps every committed row through an immediate stop and restart, answers 503 meanwhile and recovers by itself', async () => {
    const committed = await draftWithOneEntry();
    const issued = await issue(committed.draftId);
    expect(issued.status).toBe(200);
    const paid = await api.fetch(`/api/invoices/${committed.draftId}/payments`, { method: 'POST', token, body: JSON.stringify({ method: 'cheque', amount: '50', receivedOn: '2025-06-20', reference: 'Cheque 3307' }) });
    expect(paid.status).toBe(201);
    // One more issue is on its way when the server goes down.
    const inFlight = await draftWithOneEntry();
    const before = await snapshot();
    const { answer } = await issueHeldAtItsAuditRow(inFlight.draftId);
    await cluster.stopImmediately();

    expect((await answer).status).toBe(503);
    expect(await health()).toBe(503);
    const refused = await api.fetch('/api/invoices', { token });
    expect(refused.status).toBe(503);
    expect(refused.headers.get('retry-after')).not.toBeNull();

    await cluster.start();
    await waitFor('health to answer 200 after the restart', async () => ((await health()) === 200 ? true : undefined), 60_000, 250);
    expect(api.alive).toBe(true);

    expect(await snapshot()).toEqual(before);
    await expectNothingHalfDone(inFlight.draftId, inFlight.entryId);
    const list = await api.fetch('/api/invoices', { token });
    expect(list.status).toBe(200);

    const resumed = await issue(inFlight.draftId);
    expect(resumed.status).toBe(200);
    expect(await resumed.json()).toMatchObject({ number: 3 });
    expect(await billingState(dbh.db, world.fx.operationId)).toEqual({ numbers: { INV: [1, 2, 3] }, entriesOnTwoInvoices: [], partlyIssued: [], draftsMissingEntries: [] });
  }, 180_000);
});
