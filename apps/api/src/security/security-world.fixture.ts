import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { costEntries, machineShares, machines, meterReadings, memberships, rateSheets, users, workEntries, type Database } from '@hitchbook/db';
import { addEntry, addNeighbourSheet, createBillingWorld, type BillingWorld } from '../modules/invoices/billing-world.fixture.js';
import { createOperation, signInAll, type OperationFixture } from '../test-support/fixtures.js';
import type { TestApp } from '../test-support/test-app.js';

/** A 1×1 PNG, the smallest picture the upload checks accept. */
const PNG = Buffer.from('89504e470d0a1a0a0000000d4948445200000001000000010802000000907753de0000000c4944415408d763f8ffff3f0005fe02fea7d6a4c90000000049454e44ae426082', 'hex');

export type Caller = 'owner' | 'partner' | 'operator' | 'bookkeeper' | 'customer' | 'anonymous';
export const CALLERS: readonly Caller[] = ['owner', 'partner', 'operator', 'bookkeeper', 'customer', 'anonymous'];

const PDF = Buffer.from('%PDF-1.4\n1 0 obj << /Type /Catalog /Pages 2 0 R >> endobj\n2 0 obj << /Type /Pages /Kids [] /Count 0 >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n');

/** One operation with a row of every kind a route can name, made through the API where the API makes it. */
export interface SecurityWorld {
  t: TestApp;
  fx: OperationFixture;
  billing: BillingWorld<OperationFixture>;
  tokens: Awaited<ReturnType<typeof signInAll>>;
  ids: {
    machine: string;
    field: string;
    workType: string;
    party: string;
    rateSheet: string;
    cost: string;
    /** A submitted entry logged by the operator, not yet on any invoice. */
    entry: string;
    /** The customer's own issued invoice, billing `invoicedEntry`. */
    invoice: string;
    invoicedEntry: string;
    /** The other customer's issued invoice. */
    otherInvoice: string;
    draftInvoice: string;
    squareUp: string;
    transfer: string;
    upload: string;
    membership: string;
    /** A photo on `entry`. */
    photo: string;
    /** A cheque recorded against `otherInvoice`. */
    payment: string;
  };
}

/** Card payments configured against an address nothing listens on: the security probes never get that far. */
export const UNREACHABLE_STRIPE = { secretKey: 'sk_test_security', webhookSecret: 'whsec_security', host: '127.0.0.1', port: 9, protocol: 'http' as const };

export const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });

async function ok<T extends { status: number; body: unknown }>(res: Promise<T> | T, what: string): Promise<T> {
  const r = await res;
  if (r.status >= 300) throw new Error(`${what} failed with ${r.status}: ${JSON.stringify(r.body)}`);
  return r;
}

export async function createSecurityWorld(t: TestApp, label = 'Security'): Promise<SecurityWorld> {
  const db = t.dbh.db;
  const fx = await createOperation(db, label);
  const billing = await createBillingWorld(db, fx);
  const tokens = await signInAll(t, fx);
  const owner = bearer(tokens.owner);
  const operationId = fx.operationId;
  const [hA, hB] = fx.households;
  const [custC, custD] = fx.customers;

  const rateSheet = await addNeighbourSheet(db, billing);
  await addNeighbourSheet(db, billing, { name: 'Agency rates', relationship: 'agency' });
  await db.insert(machineShares).values([
    { operationId, machineId: billing.machines.tractor, partyId: hA, sharePct: '50', effectiveFrom: '2024-01-01' },
    { operationId, machineId: billing.machines.tractor, partyId: hB, sharePct: '50', effectiveFrom: '2024-01-01' },
  ]);
  await db.update(machines).set({ purchasePrice: '98000.00', listPrice: '120000.00' }).where(eq(machines.id, billing.machines.tractor));
  const [cost] = await db
    .insert(costEntries)
    .values({ operationId, machineId: billing.machines.tractor, category: 'repair', incurredOn: '2025-03-10', amount: '840.00', paidByPartyId: hA })
    .returning({ id: costEntries.id });
  await db.insert(meterReadings).values({ operationId, machineId: billing.machines.tractor, readAt: new Date('2025-03-01T08:00:00Z'), hours: '1200.0' });

  const invoicedEntry = await addEntry(db, billing, { workDate: '2025-05-01', workTypeId: billing.workTypes.mowing, fieldId: billing.fields.creekBottom, billToPartyId: custC, hours: '2.00', acres: '10.000' });
  const issue = async (partyId: string, date: string): Promise<string> => {
    const d = await ok(t.http().post('/api/invoices/drafts').set(owner).send({ partyId, from: date, to: date }), 'draft');
    await ok(t.http().post(`/api/invoices/${d.body.id}/issue`).set(owner).send({}), 'issue');
    return d.body.id as string;
  };
  const invoice = await issue(custC, '2025-05-01');
  await addEntry(db, billing, { workDate: '2025-05-02', workTypeId: billing.workTypes.mowing, fieldId: billing.fields.schoolhouse, billToPartyId: custD, hours: '1.00', acres: '5.000' });
  const otherInvoice = await issue(custD, '2025-05-02');
  await addEntry(db, billing, { workDate: '2025-05-03', workTypeId: billing.workTypes.mowing, fieldId: billing.fields.creekBottom, billToPartyId: custC, hours: '1.00', acres: '4.000' });
  const draftInvoice = (await ok(t.http().post('/api/invoices/drafts').set(owner).send({ partyId: custC, from: '2025-05-03', to: '2025-05-03' }), 'draft')).body.id as string;
  const entry = await addEntry(db, billing, { workDate: '2025-06-01', workTypeId: billing.workTypes.mowing, fieldId: billing.fields.creekBottom, billToPartyId: custC, hours: '3.00', acres: '12.000', state: 'submitted' });

  const upload = (await ok(t.http().post('/api/uploads').set(owner).field('purpose', 'receipt').attach('file', PDF, { filename: 'receipt.pdf', contentType: 'application/pdf' }), 'upload')).body.id as string;

  const photo = (await ok(t.http().post(`/api/work-entries/${entry}/photos`).set(owner).attach('file', PNG, { filename: 'gateway.png', contentType: 'image/png' }), 'photo')).body.uploadId as string;
  const payment = (await ok(t.http().post(`/api/invoices/${otherInvoice}/payments`).set(owner).send({ method: 'cheque', amount: '10.00', receivedOn: '2025-06-01', reference: 'Cheque 77' }), 'payment')).body.payment.id as string;

  const squareUp = (await ok(t.http().post('/api/square-ups').set(owner).send({ name: 'Spring 2025', periodFrom: '2025-01-01', periodTo: '2025-04-30' }), 'square-up')).body.id as string;
  const closed = await ok(t.http().post(`/api/square-ups/${squareUp}/close`).set(owner).send({}), 'close');
  const transfer = (closed.body as { transfers: Array<{ id: string }> }).transfers[0]?.id;
  if (!transfer) throw new Error('the closed square-up has no transfer to pay');

  return {
    t,
    fx,
    billing,
    tokens,
    ids: {
      machine: billing.machines.tractor,
      field: billing.fields.creekBottom,
      workType: billing.workTypes.mowing,
      party: custC,
      rateSheet,
      cost: cost!.id,
      entry,
      invoice,
      invoicedEntry,
      otherInvoice,
      draftInvoice,
      squareUp,
      transfer,
      upload,
      membership: fx.members.partner.membershipId,
      photo,
      payment,
    },
  };
}

/** Throwaway rows for the calls that would otherwise use up a shared row (deletes, closing a period). */
export const throwaway = {
  async machine(w: SecurityWorld): Promise<string> {
    const [m] = await w.t.dbh.db.insert(machines).values({ operationId: w.fx.operationId, name: `Spare wagon ${randomUUID().slice(0, 6)}`, classId: 'wagon', kind: 'implement' }).returning({ id: machines.id });
    // Owned by both households, so either may change it.
    await w.t.dbh.db.insert(machineShares).values(w.fx.households.map((partyId) => ({ operationId: w.fx.operationId, machineId: m!.id, partyId, sharePct: '50', effectiveFrom: '2024-01-01' })));
    return m!.id;
  },
  async cost(w: SecurityWorld): Promise<string> {
    const [c] = await w.t.dbh.db
      .insert(costEntries)
      .values({ operationId: w.fx.operationId, machineId: w.ids.machine, category: 'parts', incurredOn: '2025-08-01', amount: '12.50', paidByPartyId: w.fx.households[0] })
      .returning({ id: costEntries.id });
    return c!.id;
  },
  async entry(w: SecurityWorld): Promise<string> {
    const [e] = await w.t.dbh.db
      .insert(workEntries)
      .values({ operationId: w.fx.operationId, operatorUserId: w.fx.members.operator.userId, workDate: '2025-08-02', workTypeId: w.ids.workType, fieldId: w.ids.field, hours: '1.00', billToPartyId: w.ids.party, state: 'draft', clientId: randomUUID() })
      .returning({ id: workEntries.id });
    return e!.id;
  },
  async rateSheet(w: SecurityWorld): Promise<string> {
    const [s] = await w.t.dbh.db
      .insert(rateSheets)
      .values({ operationId: w.fx.operationId, name: `Old sheet ${randomUUID().slice(0, 6)}`, relationship: 'neighbour', effectiveFrom: '2019-01-01' })
      .returning({ id: rateSheets.id });
    return s!.id;
  },
  async membership(w: SecurityWorld): Promise<string> {
    const tag = randomUUID().slice(0, 8);
    const [u] = await w.t.dbh.db.insert(users).values({ email: `helper-${tag}@example.test`, name: `Helper ${tag}`, passwordHash: 'x' }).returning({ id: users.id });
    const [m] = await w.t.dbh.db.insert(memberships).values({ operationId: w.fx.operationId, userId: u!.id, role: 'operator' }).returning({ id: memberships.id });
    return m!.id;
  },
  async draftInvoice(w: SecurityWorld): Promise<string> {
    const date = '2025-08-03';
    await addEntry(w.t.dbh.db, w.billing, { workDate: date, workTypeId: w.ids.workType, fieldId: w.ids.field, billToPartyId: w.fx.customers[1], hours: '1.00', acres: '2.000' });
    const d = await ok(w.t.http().post('/api/invoices/drafts').set(bearer(w.tokens.owner)).send({ partyId: w.fx.customers[1], from: date, to: date }), 'draft');
    return d.body.id as string;
  },
  async photo(w: SecurityWorld): Promise<string> {
    const res = await ok(w.t.http().post(`/api/work-entries/${w.ids.entry}/photos`).set(bearer(w.tokens.owner)).attach('file', PNG, { filename: 'spare.png', contentType: 'image/png' }), 'photo');
    return res.body.uploadId as string;
  },
  async openSquareUp(w: SecurityWorld, year: number): Promise<string> {
    const res = await ok(w.t.http().post('/api/square-ups').set(bearer(w.tokens.owner)).send({ name: `Season ${year}`, periodFrom: `${year}-01-01`, periodTo: `${year}-12-31` }), 'square-up');
    return res.body.id as string;
  },
};
