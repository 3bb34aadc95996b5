import { eq, inArray } from 'drizzle-orm';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { invoiceEntries, workEntries } from '@hitchbook/db';
import { createOperation, signIn } from '../../test-support/fixtures.js';
import { createTestApp, type TestApp } from '../../test-support/test-app.js';
import { addEntry, addNeighbourSheet, createBillingWorld } from './billing-world.fixture.js';

// Issuing is set-based: the statements it runs do not depend on how many entries the invoice bills.
// Every statement sent by any pg client during the request is counted, except those of the job queue's
// own connections (its polling runs on its schedule, not because of the request), known by their
// application name.

let t: TestApp;
const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });

beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

/** The application name the job queue's pool connects with (core/jobs.service.ts). */
const JOB_QUEUE_APPLICATION = 'hitchbook-jobs';

function applicationNameOf(client: pg.Client): string | undefined {
  return (client as unknown as { connectionParameters?: { application_name?: string } }).connectionParameters?.application_name;
}

function statementText(args: unknown[]): string {
  const first = args[0];
  if (typeof first === 'string') return first;
  return (first as { text?: string } | null)?.text ?? '';
}

/** Drafts an invoice over `count` fresh entries, issues it, and returns the statements the issue sent. */
async function issueCounting(count: number): Promise<{ statements: string[]; entryIds: string[]; invoiceId: string }> {
  const world = await createBillingWorld(t.dbh.db, await createOperation(t.dbh.db));
  await addNeighbourSheet(t.dbh.db, world);
  const neighbour = world.fx.customers[0];
  const entryIds: string[] = [];
  for (let i = 0; i < count; i++) {
    const day = String(1 + (i % 28)).padStart(2, '0');
    entryIds.push(await addEntry(t.dbh.db, world, { workDate: `2025-05-${day}`, workTypeId: world.workTypes.mowing, fieldId: world.fields.creekBottom, billToPartyId: neighbour, hours: '2.00', acres: '10.000' }));
  }
  const { token } = await signIn(t, world.fx.members.owner.email);
  const draft = await t.http().post('/api/invoices/drafts').set(bearer(token)).send({ partyId: neighbour, from: '2025-05-01', to: '2025-05-31' });
  expect(draft.status, JSON.stringify(draft.body)).toBe(201);

  const statements: string[] = [];
  const original = pg.Client.prototype.query;
  const spy = vi.spyOn(pg.Client.prototype, 'query').mockImplementation(function (this: pg.Client, ...args: unknown[]) {
    if (applicationNameOf(this) !== JOB_QUEUE_APPLICATION) statements.push(statementText(args));
    return (original as (...a: unknown[]) => unknown).apply(this, args);
  } as typeof original);
  try {
    const res = await t.http().post(`/api/invoices/${draft.body.id}/issue`).set(bearer(token)).send({});
    expect(res.status, JSON.stringify(res.body)).toBe(200);
  } finally {
    spy.mockRestore();
  }
  return { statements, entryIds, invoiceId: draft.body.id };
}

describe('issuing an invoice', () => {
  it('sends the same statements for 5 entries as for 50, and bills all of them', async () => {
    const five = await issueCounting(5);
    const fifty = await issueCounting(50);
    expect(five.statements.length).toBeGreaterThan(0);
    expect(fifty.statements.length).toBe(five.statements.length);

    for (const run of [five, fifty]) {
      const locked = await t.dbh.db.select({ id: invoiceEntries.workEntryId }).from(invoiceEntries).where(eq(invoiceEntries.invoiceId, run.invoiceId));
      expect(locked.map((r) => r.id).sort()).toEqual([...run.entryIds].sort());
      const states = await t.dbh.db.select({ state: workEntries.state, version: workEntries.version }).from(workEntries).where(inArray(workEntries.id, run.entryIds));
      expect(states).toHaveLength(run.entryIds.length);
      for (const row of states) expect(row).toEqual({ state: 'invoiced', version: 2 });
    }
  });
});
