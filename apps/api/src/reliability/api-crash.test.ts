import { randomUUID } from 'node:crypto';
import { and, eq, inArray, sql } from 'drizzle-orm';
import { createDb, invoiceCounters, invoiceEntries, invoices, workEntries, type DbHandle } from '@hitchbook/db';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ApiProcess } from '../test-support/api-process.js';
import { billingState } from '../test-support/billing-invariants.js';
import { createOperation, FIXTURE_PASSWORD, type OperationFixture } from '../test-support/fixtures.js';
import { addEntry, addNeighbourSheet, createBillingWorld, type BillingWorld } from '../modules/invoices/billing-world.fixture.js';

const databaseUrl = process.env.DATABASE_URL;
if (!databaseUrl) throw new Error('DATABASE_URL is not set: run the tests through `npm test`.');

let dbh: DbHandle;
let api: ApiProcess;
let world: BillingWorld<OperationFixture>;
let token: string;

beforeAll(async () => {
  dbh = createDb(databaseUrl, { max: 2, applicationName: 'hitchbook-test' });
  world = await createBillingWorld(dbh.db, await createOperation(dbh.db, 'Crash test outfit'));
  await addNeighbourSheet(dbh.db, world);
  api = new ApiProcess({ databaseUrl });
  await api.start({ HB_FAULT_KILL_AFTER_COMMIT: 'invoice-issue' });
  const login = await api.fetch('/api/auth/login', { method: 'POST', body: JSON.stringify({ email: world.fx.members.owner.email, password: FIXTURE_PASSWORD }) });
  expect(login.status).toBe(200);
  token = ((await login.json()) as { accessToken: string }).accessToken;
}, 120_000);

afterAll(async () => {
  await api?.dispose();
  await dbh?.close();
});

const mowing = (workDate: string) =>
  addEntry(dbh.db, world, { workDate, workTypeId: world.workTypes.mowing, fieldId: world.fields.creekBottom, billToPartyId: world.fx.customers[0], hours: '2.00', acres: '10.000' });

async function draft(from: string, to: string): Promise<string> {
  const res = await api.fetch('/api/invoices/drafts', { method: 'POST', token, body: JSON.stringify({ partyId: world.fx.customers[0], from, to }) });
  expect(res.status).toBe(201);
  return ((await res.json()) as { id: string }).id;
}

const issue = (id: string, key: string) => api.fetch(`/api/invoices/${id}/issue`, { method: 'POST', token, headers: { 'Idempotency-Key': key }, body: '{}' });

describe('the API killed between the commit of an issue and its reply', () => {
  it('keeps the committed invoice, and a retry with the same Idempotency-Key returns it without a new number', async () => {
    const entries = [await mowing('2025-06-02'), await mowing('2025-06-03')];
    const id = await draft('2025-06-01', '2025-06-30');
    const key = `issue-${randomUUID()}`;

    // The process dies before it can answer: the client sees the connection drop, not a reply.
    await expect(issue(id, key)).rejects.toThrow();
    expect((await api.exited()).signal).toBe('SIGKILL');

    // The commit happened before the crash.
    const [committed] = await dbh.db.select().from(invoices).where(eq(invoices.id, id));
    expect(committed).toMatchObject({ status: 'issued', number: 1 });
    const locked = await dbh.db.select().from(invoiceEntries).where(inArray(invoiceEntries.workEntryId, entries));
    expect(locked.map((l) => l.invoiceId)).toEqual([id, id]);

    await api.start();
    const retry = await issue(id, key);
    expect(retry.status).toBe(200);
    expect(await retry.json()).toMatchObject({ id, status: 'issued', number: 1, numberLabel: 'INV-0001' });
    // The same request without its key is a second issue of an issued invoice, which is refused.
    const unkeyed = await api.fetch(`/api/invoices/${id}/issue`, { method: 'POST', token, body: '{}' });
    expect(unkeyed.status).toBe(409);

    // The next invoice takes the next number: none was lost or taken twice.
    await mowing('2025-07-01');
    const next = await draft('2025-07-01', '2025-07-31');
    const nextIssue = await issue(next, `issue-${randomUUID()}`);
    expect(nextIssue.status).toBe(200);
    expect(await nextIssue.json()).toMatchObject({ number: 2 });

    expect(await billingState(dbh.db, world.fx.operationId)).toEqual({ numbers: { INV: [1, 2] }, entriesOnTwoInvoices: [], partlyIssued: [], draftsMissingEntries: [] });
    const [counter] = await dbh.db.select().from(invoiceCounters).where(and(eq(invoiceCounters.operationId, world.fx.operationId), eq(invoiceCounters.series, 'INV')));
    expect(counter?.nextNumber).toBe(3);
    // Issued once: one audit row, though the request arrived twice.
    const audited = await dbh.db.execute(sql`select 1 from audit_log where entity_id = ${id} and action = 'invoice.issued'`);
    expect(audited.rows).toHaveLength(1);
    const states = await dbh.db.select({ state: workEntries.state }).from(workEntries).where(inArray(workEntries.id, entries));
    expect(states.map((s) => s.state)).toEqual(['invoiced', 'invoiced']);
  }, 120_000);
});
