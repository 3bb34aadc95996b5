import { Decimal } from 'decimal.js';
import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { machines, parties, workEntries } from '@hitchbook/db';
import { AppError, statusOf } from '../../common/errors/app-error.js';
import { createOperation, signInAll, type OperationFixture } from '../../test-support/fixtures.js';
import { createTestApp, type TestApp } from '../../test-support/test-app.js';
import { Ledger } from './ledger.fixture.js';
import { SquareUpPeriods } from './square-up-periods.js';

let t: TestApp;
const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });

beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

interface Outfit {
  fx: OperationFixture;
  tokens: Awaited<ReturnType<typeof signInAll>>;
  ledger: Ledger;
  a: string;
  b: string;
  c: string;
}

async function outfit(label: string): Promise<Outfit> {
  const fx = await createOperation(t.dbh.db, label);
  const [c] = await t.dbh.db.insert(parties).values({ operationId: fx.operationId, kind: 'household', name: `Household C ${fx.operationId.slice(0, 8)}`, relationship: 'family' }).returning({ id: parties.id });
  return { fx, tokens: await signInAll(t, fx), ledger: new Ledger(t.dbh.db, fx), a: fx.households[0], b: fx.households[1], c: c!.id };
}

async function createPeriod(o: Outfit, body: Record<string, unknown>): Promise<string> {
  const res = await t.http().post('/api/square-ups').set(bearer(o.tokens.owner)).send(body);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.id as string;
}

/**
 * The 2025 season, worked by hand. Tractor T: A and B half each until 30 June, then A 25 % and B 75 %.
 * Mower M: C alone. Family sheet 2025: T $60/h, M $40/h.
 *
 * Costs in the season (T): insurance 1,200.00 (A, 15 Apr, shares 50/50), housing 300.00 (B, 1 Aug,
 * shares 25/75), fuel 900.00 (A), repair 500.00 (B); an improvement of 1,000.01 over 4 years paid by A
 * on 1 Jun 2024, whose second slice (250.00: the odd cent went to the first) falls on 1 Jun 2025, 50/50.
 * (M): repair 200.00 and insurance 100.00, both paid by C. A fuel bill of 999.00 on 15 Nov is outside.
 *
 * Use: T by owners A 10 + 10 + 5 = 25 h, B 20 + 4 (customer work on B's field) = 24 h; by C 5 h (not an
 * owner on 10 Aug: 5 × 60 = 300.00, credited A 75.00 and B 225.00). M by C 5 + 5 = 10 h; by A 5 h
 * (5 × 40 = 200.00 to C). 6 h of customer work on customer ground and 3 h still submitted do not count.
 *
 * Pools of T: operating 1,400.00 by use 25:24 → A 714.29, B 685.71 (1,400 × 25/49 = 714.2857…, the
 * residual cent to the larger remainder); fixed 50/50 1,450.00 → 725.00 each; fixed 25/75 300.00 → 75.00
 * and 225.00. Pools of M: operating 200.00 by use → C; fixed 100.00 → C.
 *
 * A: paid 1,200 + 900 + 250 = 2,350.00; share 714.29 + 725 + 75 = 1,514.29; charged 200; credited 75;
 *    balance 2,350 − 1,514.29 − 200 + 75 = 710.71.
 * B: paid 300 + 500 = 800.00; share 685.71 + 725 + 225 = 1,635.71; credited 225; balance −610.71.
 * C: paid 300.00; share 300.00; charged 300; credited 200; balance −100.00.
 * Transfers: B pays A 610.71, C pays A 100.00.
 */
async function season2025(o: Outfit): Promise<{ tractor: string; mower: string; pendingEntry: string }> {
  const { ledger, a, b, c } = o;
  const customer = o.fx.customers[0];
  const tractor = await ledger.machine('T tractor');
  const mower = await ledger.machine('M mower', { classId: 'rotary-mower', kind: 'implement' });
  await ledger.shares(tractor, '2024-01-01', [[a, '50'], [b, '50']]);
  await ledger.shares(tractor, '2025-07-01', [[a, '25'], [b, '75']]);
  await ledger.shares(mower, '2024-01-01', [[c, '100']]);
  await ledger.rateSheet({ relationship: 'family', effectiveFrom: '2025-01-01', machineRates: [[tractor, '60'], [mower, '40']] });

  await ledger.cost(tractor, 'insurance', '2025-04-15', '1200.00', a);
  await ledger.cost(tractor, 'housing', '2025-08-01', '300.00', b);
  await ledger.cost(tractor, 'fuel', '2025-05-20', '900.00', a);
  await ledger.cost(tractor, 'repair', '2025-09-05', '500.00', b);
  await ledger.cost(tractor, 'improvement', '2024-06-01', '1000.01', a, { lifeYears: 4 });
  await ledger.cost(tractor, 'fuel', '2025-11-15', '999.00', a);
  await ledger.cost(mower, 'repair', '2025-06-10', '200.00', c);
  await ledger.cost(mower, 'insurance', '2025-04-01', '100.00', c);

  const fieldA = await ledger.field('North 40', '40', a);
  const fieldB = await ledger.field('Creek bottom', '25', b);
  const fieldC = await ledger.field('Hill pasture', '30', c);
  const customerField = await ledger.field('Neighbour ditch', '12', null);
  await ledger.entry({ date: '2025-04-20', fieldId: fieldA, billTo: a, hours: '10', power: tractor });
  await ledger.entry({ date: '2025-06-15', fieldId: fieldB, billTo: b, hours: '20', power: tractor });
  await ledger.entry({ date: '2025-07-20', fieldId: fieldA, billTo: a, hours: '10', power: tractor });
  await ledger.entry({ date: '2025-08-10', fieldId: fieldC, billTo: c, hours: '5', power: tractor, implement: mower });
  await ledger.entry({ date: '2025-09-01', fieldId: fieldB, billTo: customer, hours: '4', power: tractor, state: 'invoiced' });
  await ledger.entry({ date: '2025-09-02', fieldId: customerField, billTo: customer, hours: '6', power: tractor });
  const pendingEntry = await ledger.entry({ date: '2025-05-05', fieldId: fieldB, billTo: b, hours: '3', power: tractor, state: 'submitted' });
  await ledger.entry({ date: '2025-06-20', fieldId: fieldA, billTo: a, hours: '5', power: tractor, implement: mower });
  await ledger.entry({ date: '2025-07-01', fieldId: fieldC, billTo: c, hours: '5', implement: mower });
  return { tractor, mower, pendingEntry };
}

const SEASON = { name: 'Season 2025', periodFrom: '2025-03-01', periodTo: '2025-10-31' };

function byHousehold<T extends { householdId: string }>(rows: T[], id: string): T {
  const row = rows.find((r) => r.householdId === id);
  if (!row) throw new Error(`no row for ${id}`);
  return row;
}

describe('square-up statement', () => {
  it('splits, charges and settles the 2025 season as worked by hand, with a share change mid-period and use charges', async () => {
    const o = await outfit('Worked by hand');
    const { tractor, mower } = await season2025(o);
    const id = await createPeriod(o, SEASON);
    const res = await t.http().get(`/api/square-ups/${id}/statement`).set(bearer(o.tokens.partner));
    expect(res.status).toBe(200);
    const s = res.body;

    expect(byHousehold(s.households, o.a)).toMatchObject({ paid: '2350.00', share: '1514.29', useCharged: '200.00', useCredited: '75.00', balance: '710.71' });
    expect(byHousehold(s.households, o.b)).toMatchObject({ paid: '800.00', share: '1635.71', useCharged: '0.00', useCredited: '225.00', balance: '-610.71' });
    expect(byHousehold(s.households, o.c)).toMatchObject({ paid: '300.00', share: '300.00', useCharged: '300.00', useCredited: '200.00', balance: '-100.00' });
    expect(s.transfers.map((tr: { fromHouseholdId: string; toHouseholdId: string; amount: string }) => [tr.fromHouseholdId, tr.toHouseholdId, tr.amount])).toEqual([
      [o.b, o.a, '610.71'],
      [o.c, o.a, '100.00'],
    ]);
    expect(s.totals).toEqual({ costs: '3450.00', useCharges: '500.00', positiveBalances: '710.71' });
    expect(s.frozen).toBe(false);
    expect(s.pendingEntries).toBe(1);
    expect(s.warnings.map((w: { code: string }) => w.code)).toEqual(['entries-pending']);

    const t1 = s.machines.find((m: { machineId: string }) => m.machineId === tractor);
    expect(t1.pools).toEqual([
      { basis: 'use', shareSetFrom: null, costKinds: ['operating'], reason: null, amount: '1400.00', paid: [{ householdId: o.a, amount: '900.00' }, { householdId: o.b, amount: '500.00' }], split: [{ householdId: o.a, amount: '714.29' }, { householdId: o.b, amount: '685.71' }] },
      { basis: 'ownership', shareSetFrom: '2024-01-01', costKinds: ['fixed'], reason: null, amount: '1450.00', paid: [{ householdId: o.a, amount: '1450.00' }], split: [{ householdId: o.a, amount: '725.00' }, { householdId: o.b, amount: '725.00' }] },
      { basis: 'ownership', shareSetFrom: '2025-07-01', costKinds: ['fixed'], reason: null, amount: '300.00', paid: [{ householdId: o.b, amount: '300.00' }], split: [{ householdId: o.a, amount: '75.00' }, { householdId: o.b, amount: '225.00' }] },
    ]);
    expect(t1.ownerHours).toEqual([{ householdId: o.a, hours: '25.00' }, { householdId: o.b, hours: '24.00' }]);
    expect(t1.otherHours).toBe('5.00');
    expect(s.useCharges.map((u: { machineId: string; householdId: string; hours: string; ratePerHour: string; rateSource: string; amount: string; credits: unknown }) => [u.machineId, u.householdId, u.hours, u.ratePerHour, u.rateSource, u.amount, u.credits])).toEqual(
      expect.arrayContaining([
        [mower, o.a, '5.00', '40.00', 'rate-sheet', '200.00', [{ householdId: o.c, amount: '200.00' }]],
        [tractor, o.c, '5.00', '60.00', 'rate-sheet', '300.00', [{ householdId: o.a, amount: '75.00' }, { householdId: o.b, amount: '225.00' }]],
      ]),
    );
  });

  it('has balances that sum to zero exactly and transfers that clear them to the cent', async () => {
    const o = await outfit('Zero sum');
    await season2025(o);
    // Awkward amounts and a three-way ownership so the splits leave odd cents to place.
    const baler = await o.ledger.machine('Baler', { classId: 'large-round-baler', kind: 'implement' });
    await o.ledger.shares(baler, '2020-01-01', [[o.a, '33.3333'], [o.b, '33.3333'], [o.c, '33.3334']]);
    await o.ledger.cost(baler, 'taxes', '2025-05-01', '1000.00', o.b);
    await o.ledger.cost(baler, 'tires', '2025-05-02', '777.77', o.c);
    const id = await createPeriod(o, SEASON);
    const s = (await t.http().get(`/api/square-ups/${id}/statement`).set(bearer(o.tokens.owner))).body;
    const balances = s.households.map((h: { balance: string }) => new Decimal(h.balance));
    expect(balances.reduce((sum: Decimal, b: Decimal) => sum.plus(b), new Decimal(0)).toFixed(2)).toBe('0.00');
    const left = new Map<string, Decimal>(s.households.map((h: { householdId: string; balance: string }) => [h.householdId, new Decimal(h.balance)]));
    for (const tr of s.transfers) {
      left.set(tr.fromHouseholdId, left.get(tr.fromHouseholdId)!.plus(tr.amount));
      left.set(tr.toHouseholdId, left.get(tr.toHouseholdId)!.minus(tr.amount));
    }
    expect([...left.values()].every((v) => v.isZero())).toBe(true);
    // Fewest transfers: three households with no zero-sum pair need two.
    expect(s.transfers).toHaveLength(2);
  });

  it('settles the A3-34 combine by use: Chris pays Al $1,797.73 (Iowa State Univ. Extension AgDM File A3-34, Joint Machinery Ownership, teaching activity; transfer computed from its inputs)', async () => {
    const o = await outfit('A3-34');
    const [al, chris] = [o.a, o.b];
    const combine = await o.ledger.machine('Combine', { classId: 'combine-sp', kind: 'self-propelled', purchasePrice: '150000.00' });
    // Bought with equal investment: half each.
    await o.ledger.shares(combine, '2024-01-01', [[al, '50'], [chris, '50']]);
    // Depreciation 10 % a year of $150,000 is capital used up in the year: entered as a one-year improvement,
    // the category that carries capital. Interest 7 % = $10,500; insurance 0.5 % = $750; housing 0.5 % = $750 (Al
    // houses it); fuel and lube $1,800; repairs $2,500. Each pays half of all but housing.
    for (const partner of [al, chris]) {
      await o.ledger.cost(combine, 'improvement', '2025-01-15', '7500.00', partner, { lifeYears: 1 });
      await o.ledger.cost(combine, 'interest', '2025-12-31', '5250.00', partner);
      await o.ledger.cost(combine, 'insurance', '2025-02-01', '375.00', partner);
      await o.ledger.cost(combine, 'fuel', '2025-10-30', '900.00', partner);
      await o.ledger.cost(combine, 'repair', '2025-11-20', '1250.00', partner);
    }
    await o.ledger.cost(combine, 'housing', '2025-12-01', '750.00', al);
    // Use of 1,000 and 1,200 acres, logged at 10 acres an hour: 100 and 120 hours.
    const alField = await o.ledger.field('Al’s ground', '1000', al);
    const chrisField = await o.ledger.field('Chris’s ground', '1200', chris);
    await o.ledger.entry({ date: '2025-10-01', fieldId: alField, billTo: al, hours: '10', acres: '100', power: combine });
    for (let day = 10; day < 19; day++) await o.ledger.entry({ date: `2025-10-${day}`, fieldId: alField, billTo: al, hours: '10', acres: '100', power: combine });
    for (let day = 1; day <= 12; day++) await o.ledger.entry({ date: `2025-09-${String(day).padStart(2, '0')}`, fieldId: chrisField, billTo: chris, hours: '10', acres: '100', power: combine });

    const id = await createPeriod(o, { name: 'Harvest year 2025', periodFrom: '2025-01-01', periodTo: '2025-12-31', fixedCostsBy: 'use' });
    const s = (await t.http().get(`/api/square-ups/${id}/statement`).set(bearer(o.tokens.owner))).body;
    expect(s.totals.costs).toBe('31300.00');
    expect(byHousehold(s.households, al)).toMatchObject({ paid: '16025.00', share: '14227.27', balance: '1797.73' });
    expect(byHousehold(s.households, chris)).toMatchObject({ paid: '15275.00', share: '17072.73', balance: '-1797.73' });
    expect(s.transfers).toEqual([expect.objectContaining({ fromHouseholdId: chris, toHouseholdId: al, amount: '1797.73' })]);
  });

  it('prices use no family sheet covers at the machine’s actual cost per hour for the year, and says so', async () => {
    const o = await outfit('Actual rate');
    const truck = await o.ledger.machine('Loader tractor');
    await o.ledger.shares(truck, '2024-01-01', [[o.a, '100']]);
    const field = await o.ledger.field('B yard', '5', o.b);
    // 2025: 20 h counted, costs 700.00 (fuel 500 in the season, repair 200 in December): 35.00/h.
    await o.ledger.cost(truck, 'fuel', '2025-04-02', '500.00', o.a);
    await o.ledger.cost(truck, 'repair', '2025-12-15', '200.00', o.a);
    await o.ledger.entry({ date: '2025-04-10', fieldId: field, billTo: o.a, hours: '16', power: truck });
    await o.ledger.entry({ date: '2025-05-10', fieldId: field, billTo: o.b, hours: '4', power: truck });
    // Fuel without a paying household is left out, with a warning.
    await o.ledger.cost(truck, 'fuel', '2025-05-11', '45.00', null);
    const id = await createPeriod(o, SEASON);
    const s = (await t.http().get(`/api/square-ups/${id}/statement`).set(bearer(o.tokens.owner))).body;
    // The actual rate counts every cost logged in the year, paid by a household or not: (500 + 200 + 45) / 20 h
    // = 37.25/h, so B's 4 h come to 149.00, owed to A.
    expect(s.useCharges).toEqual([expect.objectContaining({ householdId: o.b, ratePerHour: '37.25', rateSource: 'actual-rate', rateSheetId: null, amount: '149.00' })]);
    expect(byHousehold(s.households, o.b)).toMatchObject({ balance: '-149.00' });
    expect(s.warnings.map((w: { code: string }) => w.code)).toEqual(['cost-without-payer']);
  });
});

describe('statement lines', () => {
  it('lists the costs and the machine use behind each household’s figures', async () => {
    const o = await outfit('Lines');
    const { tractor, mower } = await season2025(o);
    const id = await createPeriod(o, SEASON);
    const get = (q: string) => t.http().get(`/api/square-ups/${id}/statement/lines?${q}`).set(bearer(o.tokens.bookkeeper));

    const cCosts = (await get(`kind=cost&household=${o.c}`)).body;
    expect(cCosts).toMatchObject({ kind: 'cost', total: 2, page: 1 });
    expect(cCosts.items.map((l: { category: string; amount: string; paidByHousehold: boolean; bearsShare: boolean }) => [l.category, l.amount, l.paidByHousehold, l.bearsShare])).toEqual([
      ['insurance', '100.00', true, true],
      ['repair', '200.00', true, true],
    ]);

    const tractorCosts = (await get(`kind=cost&machine=${tractor}`)).body;
    expect(tractorCosts.total).toBe(5);
    expect(tractorCosts.items.find((l: { category: string }) => l.category === 'improvement')).toMatchObject({ incurredOn: '2025-06-01', amount: '250.00', improvementSlice: { index: 2, of: 4 }, shareSetFrom: '2024-01-01' });

    const mowerWorkOfC = (await get(`kind=work&household=${o.c}&machine=${mower}`)).body;
    expect(mowerWorkOfC.items.map((l: { workDate: string; householdId: string; userOwned: boolean; hours: string }) => [l.workDate, l.householdId, l.userOwned, l.hours])).toEqual([
      ['2025-06-20', o.a, false, '5.00'],
      ['2025-07-01', o.c, true, '5.00'],
      ['2025-08-10', o.c, true, '5.00'],
    ]);
    const bWork = (await get(`kind=work&household=${o.b}&machine=${tractor}`)).body;
    expect(bWork.items.map((l: { workDate: string; state: string; householdId: string }) => [l.workDate, l.state, l.householdId])).toEqual([
      ['2025-06-15', 'approved', o.b],
      ['2025-08-10', 'approved', o.c],
      ['2025-09-01', 'invoiced', o.b],
    ]);
  });

  it('names the bad query field', async () => {
    const o = await outfit('Lines input');
    const id = await createPeriod(o, SEASON);
    const res = await t.http().get(`/api/square-ups/${id}/statement/lines?kind=receipts&household=nope`).set(bearer(o.tokens.owner));
    expect(res.status).toBe(400);
    expect(res.body.issues.map((i: { path: string }) => i.path).sort()).toEqual(['household', 'kind']);
  });
});

describe('closing a square-up', () => {
  it('refuses while entries wait for approval, then freezes the statement, squares family work and refuses later costs in the period', async () => {
    const o = await outfit('Closing');
    const { tractor, pendingEntry } = await season2025(o);
    const id = await createPeriod(o, SEASON);
    const refused = await t.http().post(`/api/square-ups/${id}/close`).set(bearer(o.tokens.partner));
    expect(refused.status).toBe(409);
    expect(refused.body.message).toMatch(/1 work entry .* wait for approval/);

    await t.dbh.db.delete(workEntries).where(eq(workEntries.id, pendingEntry));
    const closed = await t.http().post(`/api/square-ups/${id}/close`).set(bearer(o.tokens.partner));
    expect(closed.status).toBe(200);
    expect(closed.body).toMatchObject({ frozen: true, squareUp: { status: 'closed' } });
    expect(closed.body.transfers.map((tr: { id: string; amount: string }) => [typeof tr.id, tr.amount])).toEqual([
      ['string', '610.71'],
      ['string', '100.00'],
    ]);

    const states = await t.dbh.db.select({ state: workEntries.state, date: workEntries.workDate }).from(workEntries).where(eq(workEntries.operationId, o.fx.operationId));
    const stateOn = (date: string) => states.filter((s) => s.date === date).map((s) => s.state);
    expect(stateOn('2025-04-20')).toEqual(['squared']);
    expect(stateOn('2025-09-01')).toEqual(['invoiced']);
    expect(stateOn('2025-09-02')).toEqual(['approved']);

    const guard = t.app.get(SquareUpPeriods);
    const refusal = await guard.assertPeriodOpenOrThrow(o.fx.operationId, '2025-06-01').then(
      () => null,
      (err: unknown) => err,
    );
    expect(refusal).toBeInstanceOf(AppError);
    expect(statusOf((refusal as AppError).code)).toBe(409);
    expect((refusal as AppError).message).toContain('Season 2025');
    await expect(guard.assertPeriodOpenOrThrow(o.fx.operationId, '2025-11-01')).resolves.toBeUndefined();

    const before = (await t.http().get(`/api/square-ups/${id}/statement`).set(bearer(o.tokens.owner))).body;
    // A write that skipped the guard still cannot move the stored statement.
    await o.ledger.cost(tractor, 'repair', '2025-06-01', '5000.00', o.b);
    const after = (await t.http().get(`/api/square-ups/${id}/statement`).set(bearer(o.tokens.owner))).body;
    expect(after.frozen).toBe(true);
    expect(after.households).toEqual(before.households);
    expect(after.transfers).toEqual(before.transfers);
    expect(after.totals).toEqual({ costs: '3450.00', useCharges: '500.00', positiveBalances: '710.71' });

    expect((await t.http().post(`/api/square-ups/${id}/close`).set(bearer(o.tokens.owner))).status).toBe(409);
  });

  it('records each transfer as paid once, with date, method and reference', async () => {
    const o = await outfit('Paying');
    const { pendingEntry } = await season2025(o);
    await t.dbh.db.delete(workEntries).where(and(eq(workEntries.id, pendingEntry), eq(workEntries.operationId, o.fx.operationId)));
    const id = await createPeriod(o, SEASON);
    const closed = (await t.http().post(`/api/square-ups/${id}/close`).set(bearer(o.tokens.owner))).body;
    const [first] = closed.transfers;
    const url = `/api/square-ups/${id}/transfers/${first.id}/paid`;
    const body = { paidOn: '2025-11-20', method: 'cheque', reference: 'Cheque 1042' };
    expect((await t.http().post(url).set(bearer(o.tokens.bookkeeper)).send(body)).status).toBe(403);
    const paid = await t.http().post(url).set(bearer(o.tokens.partner)).send(body);
    expect(paid.status).toBe(200);
    expect(paid.body).toMatchObject({ id: first.id, paidOn: '2025-11-20', method: 'cheque', reference: 'Cheque 1042', amount: first.amount });
    expect((await t.http().post(url).set(bearer(o.tokens.owner)).send(body)).status).toBe(409);
    const bad = await t.http().post(url).set(bearer(o.tokens.owner)).send({ paidOn: '2025-02-30', method: 'iou', extra: 1 });
    expect(bad.status).toBe(400);
    expect(bad.body.issues.map((i: { path: string }) => i.path).sort()).toEqual(['extra', 'method', 'paidOn']);
    const statement = (await t.http().get(`/api/square-ups/${id}/statement`).set(bearer(o.tokens.bookkeeper))).body;
    expect(statement.transfers[0]).toMatchObject({ paidOn: '2025-11-20', method: 'cheque' });
    expect(statement.transfers[1]).toMatchObject({ paidOn: null });
    const list = (await t.http().get('/api/square-ups').set(bearer(o.tokens.bookkeeper))).body;
    expect(list.items).toEqual([expect.objectContaining({ id, status: 'closed', transfers: 2, transfersPaid: 1, positiveBalances: '710.71' })]);
  });
});

describe('square-up periods', () => {
  it('names every bad field and refuses a period that overlaps another', async () => {
    const o = await outfit('Periods');
    const bad = await t.http().post('/api/square-ups').set(bearer(o.tokens.owner)).send({ name: '', periodFrom: '2025-13-01', periodTo: '2025-01-01', fixedCostsBy: 'luck', operationId: 'x' });
    expect(bad.status).toBe(400);
    expect(bad.body.issues.map((i: { path: string }) => i.path).sort()).toEqual(['fixedCostsBy', 'name', 'operationId', 'periodFrom']);
    const backwards = await t.http().post('/api/square-ups').set(bearer(o.tokens.owner)).send({ name: 'Backwards', periodFrom: '2025-05-01', periodTo: '2025-04-01' });
    expect(backwards.status).toBe(400);
    expect(backwards.body.issues).toEqual([{ path: 'periodTo', message: 'The period ends before it starts.' }]);
    await createPeriod(o, SEASON);
    const overlap = await t.http().post('/api/square-ups').set(bearer(o.tokens.partner)).send({ name: 'Autumn', periodFrom: '2025-10-01', periodTo: '2025-12-31' });
    expect(overlap.status).toBe(409);
    expect((await t.http().post('/api/square-ups').set(bearer(o.tokens.partner)).send({ name: 'Winter', periodFrom: '2025-11-01', periodTo: '2026-02-28' })).status).toBe(201);
  });

  it('lets the bookkeeper read and export but not write, and refuses operators and customers', async () => {
    const o = await outfit('Roles');
    await season2025(o);
    const id = await createPeriod(o, SEASON);
    const as = (role: keyof Outfit['tokens']) => bearer(o.tokens[role]);
    expect((await t.http().get(`/api/square-ups/${id}/statement`).set(as('bookkeeper'))).status).toBe(200);
    expect((await t.http().get(`/api/square-ups/${id}/statement.csv`).set(as('bookkeeper'))).status).toBe(200);
    const pdf = await t.http().get(`/api/square-ups/${id}/statement.pdf`).set(as('bookkeeper')).buffer(true).parse((res, done) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => done(null, Buffer.concat(chunks)));
    });
    expect(pdf.status).toBe(200);
    expect(pdf.headers['content-type']).toBe('application/pdf');
    expect((pdf.body as Buffer).subarray(0, 5).toString()).toBe('%PDF-');
    expect((await t.http().post('/api/square-ups').set(as('bookkeeper')).send({ ...SEASON, periodFrom: '2026-01-01', periodTo: '2026-02-01' })).status).toBe(403);
    expect((await t.http().post(`/api/square-ups/${id}/close`).set(as('bookkeeper'))).status).toBe(403);
    for (const role of ['operator', 'customer'] as const) {
      expect((await t.http().get('/api/square-ups').set(as(role))).status).toBe(403);
      expect((await t.http().get(`/api/square-ups/${id}/statement`).set(as(role))).status).toBe(403);
      expect((await t.http().get(`/api/square-ups/${id}/statement.csv`).set(as(role))).status).toBe(403);
    }
  });

  it("answers 404 for another operation's square-up in every route, and changes nothing there", async () => {
    const mine = await outfit('Mine');
    const theirs = await outfit('Theirs');
    await season2025(theirs);
    const foreign = await createPeriod(theirs, SEASON);
    const as = bearer(mine.tokens.owner);
    for (const path of ['', '/statement', '/statement/lines', '/statement.csv', '/statement.pdf']) {
      expect((await t.http().get(`/api/square-ups/${foreign}${path}`).set(as)).status, path).toBe(404);
    }
    expect((await t.http().post(`/api/square-ups/${foreign}/close`).set(as)).status).toBe(404);
    expect((await t.http().post(`/api/square-ups/${foreign}/transfers/${foreign}/paid`).set(as).send({ paidOn: '2025-11-01', method: 'cash' })).status).toBe(404);
    const still = (await t.http().get(`/api/square-ups/${foreign}`).set(bearer(theirs.tokens.owner))).body;
    expect(still.status).toBe('open');
    expect((await t.http().get('/api/square-ups').set(as)).body.total).toBe(0);
  });
});

describe('statement CSV', () => {
  it('writes one figure per row and neutralises cells a spreadsheet would run as formulas', async () => {
    const o = await outfit('CSV');
    await t.dbh.db.update(parties).set({ name: '=HYPERLINK("http://x.test","pay")' }).where(eq(parties.id, o.a));
    await t.dbh.db.update(parties).set({ name: '@SUM(A1)' }).where(eq(parties.id, o.b));
    await t.dbh.db.update(parties).set({ name: '\tTab household' }).where(eq(parties.id, o.c));
    const { tractor, mower } = await season2025(o);
    await t.dbh.db.update(machines).set({ name: '-2+3' }).where(eq(machines.id, tractor));
    await t.dbh.db.update(machines).set({ name: '+cmd|calc' }).where(eq(machines.id, mower));
    const id = await createPeriod(o, SEASON);
    const res = await t.http().get(`/api/square-ups/${id}/statement.csv`).set(bearer(o.tokens.owner));
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toContain('text/csv');
    expect(res.headers['content-disposition']).toContain('attachment');
    const lines = res.text.replace(/^\uFEFF/, '').split('\r\n');
    expect(lines[0]).toBe('Section,Household,Other household,Machine,Item,Basis,Hours,Rate per hour,Amount,Paid on,Method,Reference');
    expect(res.text).toContain(`Household,"'=HYPERLINK(""http://x.test"",""pay"")",,,Balance,,,,710.71`);
    expect(res.text).toContain("Household,'@SUM(A1),,,Balance,,,,-610.71");
    expect(res.text).toContain("Household,'\tTab household,,,Balance,,,,-100.00");
    expect(res.text).toContain(",'-2+3,");
    expect(res.text).toContain(",'+cmd|calc,");
    expect(res.text).not.toMatch(/(^|,)[=+@]/m);
  });
});
