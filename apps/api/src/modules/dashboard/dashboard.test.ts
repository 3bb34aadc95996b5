import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { invoices, meterReadings, payments } from '@hitchbook/db';
import { createOperation, signInAll, type OperationFixture } from '../../test-support/fixtures.js';
import { createTestApp, type TestApp } from '../../test-support/test-app.js';
import { Ledger } from '../square-ups/ledger.fixture.js';

let t: TestApp;
let fx: OperationFixture;
let tokens: Awaited<ReturnType<typeof signInAll>>;
const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });
const today = new Date().toISOString().slice(0, 10);
const daysAgo = (n: number) => new Date(Date.now() - n * 86_400_000).toISOString().slice(0, 10);

interface Card {
  key: string;
  label: string;
  value: string;
  hint?: string;
}

/**
 * Worked by hand, all dated around today. Waiting: two submitted entries (the operator's), one draft
 * of the operator's. Unbilled: 10 acres for the neighbour at the neighbour sheet's 15.00 an acre (150.00)
 * and one agency entry no sheet prices. Overdue: one invoice of 200.00 with 50.00 paid (150.00 left).
 * Open square-up: A paid 100.00 insurance on the 50/50 tractor, so B owes A 50.00. The tractor worked
 * this week without a reading; the loader, which also worked, was read yesterday.
 */
beforeAll(async () => {
  t = await createTestApp();
  fx = await createOperation(t.dbh.db, 'Dashboard');
  tokens = await signInAll(t, fx);
  const ledger = new Ledger(t.dbh.db, fx);
  const [a, b] = fx.households;
  const [neighbour, agency] = fx.customers;
  const tractor = await ledger.machine('Dash tractor');
  const loader = await ledger.machine('Dash loader');
  await ledger.shares(tractor, '2020-01-01', [[a, '50'], [b, '50']]);
  const mowing = await ledger.workType('Mowing');
  await ledger.rateSheet({ relationship: 'neighbour', effectiveFrom: '2020-01-01', acreRates: [[mowing, '15']] });
  const field = await ledger.field('Dash field', '40', a);
  await ledger.entry({ date: today, fieldId: field, billTo: a, hours: '3', power: tractor, state: 'submitted', workTypeId: mowing });
  await ledger.entry({ date: today, fieldId: field, billTo: a, hours: '2', power: loader, state: 'submitted', workTypeId: mowing });
  await ledger.entry({ date: today, fieldId: field, billTo: a, hours: '1', power: loader, state: 'draft', workTypeId: mowing });
  await ledger.entry({ date: daysAgo(1), fieldId: field, billTo: neighbour, hours: '4', acres: '10', power: tractor, workTypeId: mowing });
  await ledger.entry({ date: daysAgo(1), fieldId: field, billTo: agency, hours: '2', acres: '5', power: tractor, workTypeId: mowing });
  await t.dbh.db.insert(meterReadings).values({ operationId: fx.operationId, machineId: loader, readAt: new Date(Date.now() - 86_400_000), hours: '812.0' });
  const invoiceId = await ledger.invoice({ partyId: neighbour, number: 7, issueDate: daysAgo(45), lines: [{ workTypeName: 'Mowing', amount: '200.00' }] });
  await t.dbh.db.update(invoices).set({ total: '200.00', subtotal: '200.00', amountPaid: '50.00', dueDate: daysAgo(15) }).where(eq(invoices.id, invoiceId));
  // Refund due: 80.00 paid by card on invoice 8 after it was voided.
  const voided = await ledger.invoice({ partyId: neighbour, number: 8, issueDate: daysAgo(20), lines: [{ workTypeName: 'Mowing', amount: '80.00' }] });
  await t.dbh.db.update(invoices).set({ total: '80.00', subtotal: '80.00', amountPaid: '80.00', status: 'void', voidReason: 'Billed twice' }).where(eq(invoices.id, voided));
  await t.dbh.db.insert(payments).values({ operationId: fx.operationId, invoiceId: voided, method: 'card', amount: '80.00', receivedOn: daysAgo(3), stripePaymentIntentId: `pi_test_dashboard_${fx.operationId}`, refundDue: 'Paid by card after the invoice was voided; refund it to the payer.' });
  await ledger.cost(tractor, 'insurance', daysAgo(2), '100.00', a);
  const created = await t.http().post('/api/square-ups').set(bearer(tokens.owner)).send({ name: 'This season', periodFrom: daysAgo(60), periodTo: daysAgo(-60) });
  expect(created.status).toBe(201);
});
afterAll(() => t.close());

async function dashboardOf(role: keyof typeof tokens): Promise<{ cards: Card[]; charts: Array<{ key: string; unit: string; points: Array<{ label: string; value: string }> }> }> {
  const res = await t.http().get('/api/dashboard').set(bearer(tokens[role]));
  expect(res.status).toBe(200);
  return res.body;
}

const card = (cards: Card[], key: string) => cards.find((c) => c.key === key);

describe('dashboard', () => {
  it('shows the owner what needs doing, with money', async () => {
    const { cards, charts } = await dashboardOf('owner');
    expect(card(cards, 'entries-waiting')?.value).toBe('2');
    expect(card(cards, 'unbilled-work')).toMatchObject({ value: '$150.00', hint: expect.stringContaining('2 approved entries for 2 customers') });
    expect(card(cards, 'unbilled-work')?.hint).toContain('1 without a rate');
    expect(card(cards, 'overdue-invoices')).toMatchObject({ value: '1', hint: '$150.00 past due' });
    expect(card(cards, 'refunds-due')).toMatchObject({ value: '1', hint: '$80.00 paid by card to hand back, on INV-0008' });
    expect(card(cards, 'square-up-balance')).toMatchObject({ label: 'Open square-up: This season', value: '$50.00' });
    expect(card(cards, 'meter-readings-due')).toMatchObject({ value: '1', hint: expect.stringContaining('Dash tractor') });
    const unbilled = charts.find((c) => c.key === 'unbilled-by-customer');
    expect(unbilled?.points.map((p) => p.value).sort()).toEqual(['0.00', '150.00']);
    const hours = charts.find((c) => c.key === 'hours-per-week')!;
    expect(hours.points).toHaveLength(12);
    // Over the twelve weeks: the submitted 3 + 2 h and yesterday's approved 4 + 2 h; drafts never count.
    const total = hours.points.reduce((sum, p) => sum + Number(p.value), 0);
    expect(total).toBe(11);
  });

  it('gives the bookkeeper the money figures and no approval queue', async () => {
    const { cards } = await dashboardOf('bookkeeper');
    expect(cards.map((c) => c.key)).toEqual(expect.arrayContaining(['unbilled-work', 'overdue-invoices', 'square-up-balance']));
    expect(card(cards, 'entries-waiting')).toBeUndefined();
    // Only the owner refunds, so only the owner is asked to.
    expect(card(cards, 'refunds-due')).toBeUndefined();
    expect(card((await dashboardOf('partner')).cards, 'refunds-due')).toBeUndefined();
  });

  it('shows an operator their own entries and hours and never a money figure', async () => {
    const body = await dashboardOf('operator');
    expect(card(body.cards, 'my-drafts')?.value).toBe('1');
    expect(card(body.cards, 'my-submitted')?.value).toBe('2');
    expect(body.cards.map((c) => c.key)).not.toEqual(expect.arrayContaining(['unbilled-work']));
    expect(body.charts.map((c) => c.key)).toEqual(['hours-per-week']);
    expect(JSON.stringify(body)).not.toContain('$');
    expect(body.charts.every((c) => c.unit !== 'usd')).toBe(true);
  });

  it('shows a customer only their own open invoices and balance', async () => {
    const mine = await dashboardOf('customer');
    expect(card(mine.cards, 'open-invoices')?.value).toBe('1');
    expect(card(mine.cards, 'open-balance')?.value).toBe('$150.00');
    expect(mine.charts).toEqual([]);
    const other = await dashboardOf('customer2');
    expect(card(other.cards, 'open-invoices')?.value).toBe('0');
    expect(card(other.cards, 'open-balance')?.value).toBe('$0.00');
  });
});
