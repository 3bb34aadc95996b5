import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { fields, workEntries } from '@hitchbook/db';
import { createOperation, signInAll, type OperationFixture } from '../../test-support/fixtures.js';
import { createTestApp, type TestApp } from '../../test-support/test-app.js';

let t: TestApp;
let fx: OperationFixture;
let tokens: Awaited<ReturnType<typeof signInAll>>;
let machineId: string;
const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });

// The Iowa State AgDM A3-29 (2015) tractor of the trade reference §6a: 180 max-PTO-hp diesel, list
// $150,000, purchase $130,000, 15 years at 400 h/yr, bought new. Interest 8 % is passed in.
const A3_29_TRACTOR = {
  name: 'A3-29 tractor', classId: 'tractor-2wd', year: 2020, purchaseDate: '2020-03-01', ptoHp: 180, fuelType: 'diesel',
  listPrice: 150000, purchasePrice: 130000, hoursAtPurchase: 0, plannedYearsOwned: 15, plannedHoursPerYear: 400,
};

beforeAll(async () => {
  t = await createTestApp();
  fx = await createOperation(t.dbh.db);
  tokens = await signInAll(t, fx);
  const owner = bearer(tokens.owner);
  const made = await t.http().post('/api/machines').set(owner).send({ ...A3_29_TRACTOR, owners: [{ partyId: fx.households[0], sharePct: 100 }] });
  machineId = made.body.id;
  for (const [readAt, hours] of [['2024-12-20T12:00:00Z', 1000], ['2025-06-01T12:00:00Z', 1150], ['2025-12-15T12:00:00Z', 1300]] as const) {
    await t.http().post(`/api/machines/${machineId}/meter-readings`).set(owner).send({ readAt, hours });
  }
  const paid = fx.households[0];
  for (const cost of [
    { category: 'fuel', incurredOn: '2025-05-10', amount: '540.00', gallons: 180, paidByPartyId: paid },
    { category: 'fuel', incurredOn: '2025-09-10', amount: '360.00', gallons: 120, paidByPartyId: paid },
    { category: 'repair', incurredOn: '2025-07-01', amount: '1200.00', paidByPartyId: paid },
    { category: 'insurance', incurredOn: '2025-01-05', amount: '450.00', paidByPartyId: paid },
    { category: 'improvement', incurredOn: '2023-02-01', amount: '5000.00', improvementLifeYears: 5, paidByPartyId: paid },
    { category: 'repair', incurredOn: '2024-10-01', amount: '700.00', paidByPartyId: paid },
  ]) {
    expect((await t.http().post(`/api/machines/${machineId}/costs`).set(owner).send(cost)).status).toBe(201);
  }
  const [field] = await t.dbh.db.insert(fields).values({ operationId: fx.operationId, name: 'Summary field', acres: '60' }).returning();
  const workType = await t.dbh.db.query.workTypes.findFirst({ where: (w, { and, eq }) => and(eq(w.operationId, fx.operationId), eq(w.key, 'field-cultivating')) });
  const entry = (workDate: string, hours: string, acres: string, state: 'draft' | 'approved') => ({
    operationId: fx.operationId, workDate, operatorUserId: fx.members.operator.userId, fieldId: field!.id, workTypeId: workType!.id,
    powerMachineId: machineId, hours, acres, billToPartyId: fx.households[0], state,
  });
  await t.dbh.db.insert(workEntries).values([entry('2025-04-20', '8', '60', 'approved'), entry('2025-04-21', '6.5', '40', 'approved'), entry('2025-04-22', '10', '50', 'draft')]);
});
afterAll(() => t.close());

describe('machine page summary', () => {
  it('adds up the year’s hours, acres and costs as checked by hand', async () => {
    const res = await t.http().get(`/api/machines/${machineId}/summary?year=2025&interestRatePct=8`).set(bearer(tokens.bookkeeper));
    expect(res.status).toBe(200);
    expect(res.body.year).toBe(2025);
    // Meter: 1,300.0 at the last 2025 reading less 1,000.0 at the last 2024 one = 300 h, above the 14.5 h
    // of approved entries (8 + 6.5; the draft does not count). Acres: 60 + 40.
    expect(res.body.usage).toEqual({ hours: '300.00', source: 'meter', meterHours: '300.0', entryHours: '14.50', acres: '100.000' });
    expect(res.body.meterHistory.map((r: { totalHours: string }) => r.totalHours)).toEqual(['1000.0', '1150.0', '1300.0']);
    // Spent in 2025: fuel 540 + 360, repair 1,200, insurance 450; the 2023 improvement was not paid in 2025.
    expect(res.body.costTotals.fuelGallons).toBe('300.000');
    expect(res.body.costTotals.byCategory).toMatchObject({ fuel: '900.00', repair: '1200.00', insurance: '450.00', improvement: '0.00', total: '2550.00' });
    // Actual rate: the same plus a fifth of the $5,000 improvement ($1,000) = $3,550 for the year;
    // per hour 3,550 / 300 = 11.8333 → $11.83; per acre 3,550 / 100 = $35.50; fuel 900 / 300 = $3.00/h.
    expect(res.body.actualRate.perYear).toMatchObject({ improvement: '1000.00', total: '3550.00' });
    expect(res.body.actualRate.perHour).toMatchObject({ fuel: '3.00', total: '11.83' });
    expect(res.body.actualRate.perAcre.total).toBe('35.50');
  });

  it('estimates the published-method rate from the machine’s own numbers and names every input', async () => {
    const res = await t.http().get(`/api/machines/${machineId}/summary?year=2025&interestRatePct=8`).set(bearer(tokens.owner));
    const rate = res.body.estimatedRate;
    expect(rate.available).toBe(true);
    // Remaining value (D497, tractor > 150 hp; coefficients from memory): (0.976 − 0.119·√15 − 0.0019·√400)²
    // = 22.76 % of list (A3-29 prints 23 %) → salvage $34,145.81.
    expect(rate.remainingValuePct).toBe('22.76');
    expect(rate.salvageValue).toBe('34145.81');
    // Capital recovery (A3-29 form): (130,000 − 34,145.81) × CRF(8 %, 15) 0.1168295 + 34,145.81 × 0.08
    // = $13,930.27/yr = $34.83/h; TIH 1 % of (130,000 + 34,145.81)/2 = $820.73/yr = $2.05/h.
    expect(rate.perYear.capitalRecovery).toBe('13930.27');
    expect(rate.perHour).toMatchObject({ capitalRecovery: '34.83', tih: '2.05', ownership: '36.88' });
    // Repairs 0.007 × 150,000 × 6² / 6,000 h = $6.30/h (trade reference worked check, D497 factors from
    // memory); fuel 0.044 gal/hp·h × 180 hp (EP496.3) × $3.00 from the year's tickets (900 / 300 gal) =
    // $23.76/h; lube 15 % of fuel = $3.56/h (A3-29). No operator in a machine rate.
    expect(rate.perHour).toMatchObject({ repairs: '6.30', fuel: '23.76', lube: '3.56', labor: '0.00', operating: '33.62', total: '70.50' });
    // With A3-29's $16.50/h labour this is $87.00/h, against the reference's $86.97 at its rounded 23 % salvage.
    const inputs = Object.fromEntries(rate.inputs.map((i: { name: string; value: string; source: string }) => [i.name, [i.value, i.source]]));
    expect(inputs).toMatchObject({
      interestRatePct: ['8', 'query'],
      fuelPricePerGallon: ['3', 'year-records'],
      hoursPerYear: ['400', 'machine'],
      yearsOwned: ['15', 'machine'],
      rf1: ['0.007', 'class-default'],
      tihPct: ['1', 'method-default'],
    });
  });

  it('falls back to class defaults and says so', async () => {
    const made = await t.http().post('/api/machines').set(bearer(tokens.owner)).send({ name: 'Bare disk', classId: 'tandem-disk', listPrice: 40000 });
    const res = await t.http().get(`/api/machines/${made.body.id}/summary?year=2025`).set(bearer(tokens.owner));
    const inputs = Object.fromEntries(res.body.estimatedRate.inputs.map((i: { name: string; value: string; source: string }) => [i.name, [i.value, i.source]]));
    // A3-29: 10-12 years for most machines; hours per year spread the class's 2,000-hour life over them.
    expect(inputs).toMatchObject({ purchasePrice: ['40000.00', 'machine'], yearsOwned: ['12', 'class-default'], hoursPerYear: ['166.7', 'class-default'], interestRatePct: ['5', 'method-default'] });
    expect(inputs).not.toHaveProperty('fuelPricePerGallon');
    expect(res.body.estimatedRate.perHour.fuel).toBe('0.00');
    const noPrice = await t.http().post('/api/machines').set(bearer(tokens.owner)).send({ name: 'Unpriced', classId: 'wagon' });
    const unavailable = await t.http().get(`/api/machines/${noPrice.body.id}/summary`).set(bearer(tokens.owner));
    expect(unavailable.body.estimatedRate).toEqual({ available: false, reason: expect.stringMatching(/list or purchase price/) });
    expect(unavailable.body.actualRate.perHour).toBeNull();
  });

  it('gives operators the hours and meter history but no money at all', async () => {
    const res = await t.http().get(`/api/machines/${machineId}/summary?year=2025`).set(bearer(tokens.operator));
    expect(res.status).toBe(200);
    expect(res.body.usage.hours).toBe('300.00');
    for (const key of ['costTotals', 'estimatedRate', 'actualRate']) expect(res.body).not.toHaveProperty(key);
    expect(res.body.machine).not.toHaveProperty('listPrice');
    expect(res.body.notice).toMatch(/not tax, legal or accounting advice/);
    expect((await t.http().get(`/api/machines/${machineId}/summary`).set(bearer(tokens.customer))).status).toBe(403);
    expect((await t.http().get(`/api/machines/${machineId}/summary?year=twenty`).set(bearer(tokens.owner))).status).toBe(400);
  });
});
