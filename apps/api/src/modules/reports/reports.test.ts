import { Decimal } from 'decimal.js';
import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { machineRates, rateSheets } from '@hitchbook/db';
import { createOperation, signInAll, type OperationFixture } from '../../test-support/fixtures.js';
import { createTestApp, type TestApp } from '../../test-support/test-app.js';
import { Ledger } from '../square-ups/ledger.fixture.js';

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
}

async function outfit(label: string): Promise<Outfit> {
  const fx = await createOperation(t.dbh.db, label);
  return { fx, tokens: await signInAll(t, fx), ledger: new Ledger(t.dbh.db, fx) };
}

/**
 * The Iowa State AgDM A3-29 (2015) tractor with a year of logs, worked by hand.
 * 2025 hours: 10 (approved) + 15 (squared) + 5 (invoiced) = 30 h over 100 + 150 + 50 = 300 acres; a draft
 * and a 2024 entry do not count. 2025 costs: fuel 300.00 for 100 gal and 150.00 for 50 gal (3.00/gal),
 * repair 1,000.00, parts 100.00, tires 50.00, insurance 200.00, and a third of a 3,000.00 improvement of
 * 2023 (1,000.00); a 2021 improvement over 3 years and a 2024 repair fall outside. Total 2,800.00:
 * 93.33 per hour (2,800/30), 9.33 per acre, fuel 15.00 per hour. The invoiced 50 acres billed 1,000.00:
 * 20.00 per acre, 200.00 per hour.
 */
async function a329Tractor(o: Outfit): Promise<string> {
  const { ledger, fx } = o;
  const [a] = fx.households;
  const tractor = await ledger.machine('A3-29 tractor', {
    classId: 'tractor-2wd',
    kind: 'power',
    ptoHp: '180',
    fuelType: 'diesel',
    listPrice: '150000.00',
    purchasePrice: '130000.00',
    purchaseDate: '2025-01-10',
    year: 2025,
    plannedYearsOwned: 15,
    plannedHoursPerYear: '400',
  });
  await ledger.shares(tractor, '2025-01-01', [[a, '100']]);
  // The trade reference's test choices beside A3-29's inputs: diesel $3.00/gal, wage $15.00/h.
  await ledger.rateSheet({ relationship: 'family', effectiveFrom: '2025-01-01', operatorWage: '15.00' });
  await ledger.cost(tractor, 'fuel', '2025-04-01', '300.00', a, { gallons: '100' });
  await ledger.cost(tractor, 'fuel', '2025-07-01', '150.00', a, { gallons: '50' });
  await ledger.cost(tractor, 'repair', '2025-05-05', '1000.00', a);
  await ledger.cost(tractor, 'parts', '2025-05-06', '100.00', a);
  await ledger.cost(tractor, 'tires', '2025-05-07', '50.00', a);
  await ledger.cost(tractor, 'insurance', '2025-01-15', '200.00', a);
  await ledger.cost(tractor, 'improvement', '2023-05-01', '3000.00', a, { lifeYears: 3 });
  await ledger.cost(tractor, 'improvement', '2021-03-01', '900.00', a, { lifeYears: 3 });
  await ledger.cost(tractor, 'repair', '2024-06-01', '5000.00', a);
  const home = await ledger.field('Home quarter', '160', a);
  const neighbour = await ledger.field('Neighbour’s 80', '80', null);
  await ledger.entry({ date: '2025-04-10', fieldId: home, billTo: a, hours: '10', acres: '100', power: tractor });
  await ledger.entry({ date: '2025-05-10', fieldId: home, billTo: a, hours: '15', acres: '150', power: tractor, state: 'squared' });
  const billed = await ledger.entry({ date: '2025-06-10', fieldId: neighbour, billTo: fx.customers[0], hours: '5', acres: '50', power: tractor, state: 'invoiced' });
  await ledger.entry({ date: '2025-06-11', fieldId: home, billTo: a, hours: '8', acres: '80', power: tractor, state: 'draft' });
  await ledger.entry({ date: '2024-09-01', fieldId: home, billTo: a, hours: '20', acres: '200', power: tractor });
  await ledger.invoice({ partyId: fx.customers[0], number: 1, issueDate: '2025-06-20', lines: [{ entryId: billed, workDate: '2025-06-10', workTypeName: 'Tillage', quantity: '50', unit: 'acre', amount: '1000.00' }] });
  return tractor;
}

describe('year-end machine rates', () => {
  it('reports hours, costs by category and cost per hour and acre of a machine worked by hand', async () => {
    const o = await outfit('Machine rates');
    const tractor = await a329Tractor(o);
    const res = await t.http().get('/api/reports/machine-rates?year=2025').set(bearer(o.tokens.bookkeeper));
    expect(res.status).toBe(200);
    const row = res.body.machines.find((m: { machineId: string }) => m.machineId === tractor);
    expect(row).toMatchObject({ hours: '30.00', acres: '300.00' });
    expect(row.costs).toEqual({ fuel: '450.00', repair: '1000.00', parts: '100.00', tires: '50.00', insurance: '200.00', taxes: '0.00', housing: '0.00', interest: '0.00', improvement: '1000.00', total: '2800.00' });
    expect(row.perHour).toMatchObject({ fuel: '15.00', total: '93.33' });
    expect(row.perAcre).toMatchObject({ total: '9.33' });
    expect(row.customRate).toEqual({ source: 'invoices', perAcre: '20.00', perHour: '200.00', revenue: '1000.00' });
    expect(res.body.charts.costPerHourByCategory).toEqual([expect.objectContaining({ machineId: tractor, total: '93.33', fuel: '15.00' })]);
  });

  it('estimates the A3-29 tractor at $86.97/h ± $0.05 from the machine’s own numbers (Iowa State AgDM A3-29, 2015, inputs; fuel $3.00 and wage $15.00 as the trade reference §6a chooses)', async () => {
    const o = await outfit('A3-29 estimate');
    const tractor = await a329Tractor(o);
    const row = (await t.http().get('/api/reports/machine-rates?year=2025').set(bearer(o.tokens.owner))).body.machines.find((m: { machineId: string }) => m.machineId === tractor);
    expect(row.estimate.available).toBe(true);
    // The remaining-value curve gives 22.76 % where A3-29 rounds to 23 %: about 3 cents an hour of difference.
    expect(Math.abs(new Decimal(row.estimate.perHour.total).minus('86.97').toNumber())).toBeLessThanOrEqual(0.05);
    expect(row.estimate.perHour).toMatchObject({ repairs: '6.30', fuel: '23.76', labor: '16.50' });
    expect(row.estimate.remainingValuePct).toBe('22.76');
    const input = (name: string) => row.estimate.inputs.find((i: { name: string }) => i.name === name);
    expect(input('fuelPricePerGallon')).toEqual({ name: 'fuelPricePerGallon', value: '3.000', source: 'year-records' });
    expect(input('laborWagePerHour')).toEqual({ name: 'laborWagePerHour', value: '15.00', source: 'rate-sheet' });
    expect(input('interestRatePct')).toEqual({ name: 'interestRatePct', value: '8', source: 'method-default' });
    expect(input('yearsOwned')).toMatchObject({ value: '15', source: 'machine' });
  });

  it('flags cost far above the estimate and use below break-even, and suggests next year’s rate by the documented rule', async () => {
    const o = await outfit('Flags');
    const tractor = await a329Tractor(o);
    const row = (await t.http().get('/api/reports/machine-rates?year=2025').set(bearer(o.tokens.partner))).body.machines.find((m: { machineId: string }) => m.machineId === tractor);
    // Repairs (1,150/30 = 38.33), fuel (15.00) and TIH (200/30 = 6.67) against the estimate's 6.30, 27.32 and 2.05.
    expect(row.comparison.map((c: { item: string; actualPerHour: string }) => [c.item, c.actualPerHour])).toEqual([
      ['repairs', '38.33'],
      ['fuel-and-lube', '15.00'],
      ['tih', '6.67'],
    ]);
    expect(row.flags.map((f: { code: string }) => f.code)).toEqual(['actual-above-estimate', 'below-break-even']);
    // Own operating cost per acre: (fuel 450 + repair 1,000 + parts 100 + tires 50 + labour 16.50 × 30 h) / 300 = 6.98.
    expect(row.breakEven).toMatchObject({ customRatePerAcre: '20.00', variableCostPerAcre: '6.98', reason: null });
    const expected = new Decimal(row.estimate.perYear.ownership).div(new Decimal(20).minus(new Decimal(2095).div(300)));
    expect(Math.abs(new Decimal(row.breakEven.acres).minus(expected).toNumber())).toBeLessThan(0.01);
    // Higher of actual 93.333… and the estimate without labour (about 70.50), plus 10 %: 102.67.
    expect(row.suggestedRate).toEqual({ perHour: '102.67', basis: 'actual', marginPct: '10' });
    const thinner = (await t.http().get('/api/reports/machine-rates?year=2025&marginPct=5').set(bearer(o.tokens.partner))).body.machines[0];
    expect(thinner.suggestedRate).toEqual({ perHour: '98.00', basis: 'actual', marginPct: '5' });
  });

  it('copies accepted suggestions into a new family sheet from 1 January, for the owner only', async () => {
    const o = await outfit('Accept');
    const tractor = await a329Tractor(o);
    const body = { year: 2025, machineIds: [tractor] };
    expect((await t.http().post('/api/reports/machine-rates/accept').set(bearer(o.tokens.partner)).send(body)).status).toBe(403);
    expect((await t.http().post('/api/reports/machine-rates/accept').set(bearer(o.tokens.bookkeeper)).send(body)).status).toBe(403);
    const res = await t.http().post('/api/reports/machine-rates/accept').set(bearer(o.tokens.owner)).send(body);
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ name: 'Family rates 2026', effectiveFrom: '2026-01-01', machineRates: [{ machineId: tractor, ratePerHour: '102.67' }] });
    const [sheet] = await t.dbh.db.select().from(rateSheets).where(eq(rateSheets.id, res.body.rateSheetId));
    expect(sheet).toMatchObject({ operationId: o.fx.operationId, relationship: 'family', partyId: null, operatorWage: '15.00' });
    const rates = await t.dbh.db.select().from(machineRates).where(and(eq(machineRates.rateSheetId, sheet!.id), eq(machineRates.operationId, o.fx.operationId)));
    expect(rates.map((r) => [r.machineId, r.ratePerHour])).toEqual([[tractor, '102.6700']]);
    expect((await t.http().post('/api/reports/machine-rates/accept').set(bearer(o.tokens.owner)).send(body)).status).toBe(409);
  });

  it('names every bad field of a report query and an acceptance', async () => {
    const o = await outfit('Report input');
    const noYear = await t.http().get('/api/reports/machine-rates?interestRatePct=lots').set(bearer(o.tokens.owner));
    expect(noYear.status).toBe(400);
    expect(noYear.body.issues.map((i: { path: string }) => i.path).sort()).toEqual(['interestRatePct', 'year']);
    expect((await t.http().get('/api/reports/custom-income?year=1850').set(bearer(o.tokens.owner))).body.issues[0].path).toBe('year');
    const other = await outfit('Someone else');
    const foreignMachine = await other.ledger.machine('Not yours');
    const bad = await t.http().post('/api/reports/machine-rates/accept').set(bearer(o.tokens.owner)).send({ year: 2025, machineIds: [foreignMachine] });
    expect(bad.status).toBe(400);
    expect(bad.body.issues).toEqual([{ path: 'machineIds.0', message: 'No such machine in the year’s report.' }]);
    const empty = await t.http().post('/api/reports/machine-rates/accept').set(bearer(o.tokens.owner)).send({ year: 2025, machineIds: [], rateSheetId: 'x' });
    expect(empty.body.issues.map((i: { path: string }) => i.path).sort()).toEqual(['machineIds', 'rateSheetId']);
  });

  it('reports only its own operation’s machines and refuses operators and customers', async () => {
    const o = await outfit('Scoped');
    const mine = await a329Tractor(o);
    const other = await outfit('Other outfit');
    await a329Tractor(other);
    const report = (await t.http().get('/api/reports/machine-rates?year=2025').set(bearer(o.tokens.owner))).body;
    expect(report.machines.map((m: { machineId: string }) => m.machineId)).toEqual([mine]);
    for (const role of ['operator', 'customer'] as const) {
      for (const path of ['/api/reports/machine-rates?year=2025', '/api/reports/machine-rates.csv?year=2025', '/api/reports/custom-income?year=2025', '/api/reports/machine-hours']) {
        expect((await t.http().get(path).set(bearer(o.tokens[role]))).status, `${role} ${path}`).toBe(403);
      }
    }
  });

  it('gives hours per year per machine over the years with entries', async () => {
    const o = await outfit('History');
    const tractor = await a329Tractor(o);
    const res = await t.http().get('/api/reports/machine-hours').set(bearer(o.tokens.bookkeeper));
    expect(res.body).toEqual({ years: [2024, 2025], machines: [{ machineId: tractor, name: 'A3-29 tractor', hours: ['20.00', '30.00'] }] });
  });

  it('exports the year as CSV for the bookkeeper with formula triggers neutralised, and as a PDF summary', async () => {
    const o = await outfit('Exports');
    await a329Tractor(o);
    await o.ledger.machine('=1+1 trailer', { classId: 'wagon', kind: 'implement', listPrice: '8000.00' });
    const csv = await t.http().get('/api/reports/machine-rates.csv?year=2025').set(bearer(o.tokens.bookkeeper));
    expect(csv.status).toBe(200);
    const lines = csv.text.replace(/^\uFEFF/, '').trim().split('\r\n');
    expect(lines[0]!.split(',').slice(0, 5)).toEqual(['Machine', 'Class', 'Status', 'Hours', 'Acres']);
    expect(lines.find((l) => l.startsWith('A3-29 tractor'))).toContain(',30.00,300.00,450.00,1000.00,100.00,50.00,200.00,0.00,0.00,0.00,1000.00,2800.00,93.33,9.33,');
    expect(lines.some((l) => l.startsWith("'=1+1 trailer,"))).toBe(true);
    const pdf = await t.http().get('/api/reports/machine-rates.pdf?year=2025').set(bearer(o.tokens.bookkeeper)).buffer(true).parse((res, done) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => done(null, Buffer.concat(chunks)));
    });
    expect(pdf.headers['content-type']).toBe('application/pdf');
    expect((pdf.body as Buffer).subarray(0, 5).toString()).toBe('%PDF-');
  });
});

describe('custom income', () => {
  /**
   * Worked by hand. 2025: invoice 1 to C (mowing 20 acres 300.00, travel 25.00), invoice 2 to D (mowing
   * 10 acres 150.00), a credit note of 50.00 on invoice 1; a void invoice of 999.00 and an invoice issued
   * in December 2024 are left out. C: 300 + 25 − 50 = 275.00; D: 150.00; total 425.00.
   * Field costs: the mower's 2025 repair 300.00 over its 2 h on the east field and 1 h on the west field
   * (200.00 and 100.00: 5.00 and 10.00 an acre on 40 and 10 acres); the idle loader's 90.00 has no field.
   */
  it('sums issued invoice lines by customer and work type and spreads machine costs over fields by hours', async () => {
    const o = await outfit('Custom income');
    const { ledger, fx } = o;
    const [c, d] = fx.customers;
    const first = await ledger.invoice({ partyId: c, number: 1, issueDate: '2025-03-10', lines: [{ workTypeName: 'Mowing', quantity: '20', unit: 'acre', amount: '300.00' }, { kind: 'travel', amount: '25.00' }] });
    await ledger.invoice({ partyId: d, number: 2, issueDate: '2025-04-01', lines: [{ workTypeName: 'Mowing', quantity: '10', unit: 'acre', amount: '150.00' }] });
    await ledger.invoice({ partyId: c, number: 1, issueDate: '2025-06-01', creditOf: first, lines: [{ kind: 'adjustment', amount: '-50.00' }] });
    await ledger.invoice({ partyId: d, number: 3, issueDate: '2025-05-01', status: 'void', lines: [{ workTypeName: 'Mowing', quantity: '60', unit: 'acre', amount: '999.00' }] });
    await ledger.invoice({ partyId: d, number: 4, issueDate: '2024-12-30', lines: [{ workTypeName: 'Mowing', quantity: '5', unit: 'acre', amount: '75.00' }] });

    const mower = await ledger.machine('Rotary cutter', { classId: 'rotary-mower', kind: 'implement' });
    const loader = await ledger.machine('Loader');
    await ledger.cost(mower, 'repair', '2025-05-01', '300.00', fx.households[0]);
    await ledger.cost(loader, 'repair', '2025-05-01', '90.00', fx.households[0]);
    const east = await ledger.field('East field', '40', fx.households[0]);
    const west = await ledger.field('West field', '10', fx.households[1]);
    await ledger.entry({ date: '2025-05-10', fieldId: east, billTo: fx.households[0], hours: '2', acres: '40', implement: mower });
    await ledger.entry({ date: '2025-05-11', fieldId: west, billTo: fx.households[1], hours: '1', acres: '10', implement: mower });

    const res = await t.http().get('/api/reports/custom-income?year=2025').set(bearer(o.tokens.bookkeeper));
    expect(res.status).toBe(200);
    expect(res.body.total).toBe('425.00');
    expect(res.body.byCustomer.map((r: { partyId: string; amount: string; invoices: number }) => [r.partyId, r.amount, r.invoices])).toEqual([
      [c, '275.00', 1],
      [d, '150.00', 1],
    ]);
    expect(res.body.byWorkType).toEqual([
      { workType: 'Mowing', unit: 'acre', quantity: '30.000', amount: '450.00', lines: 2 },
      { workType: 'Travel', unit: null, quantity: null, amount: '25.00', lines: 1 },
      { workType: 'Adjustments', unit: null, quantity: null, amount: '-50.00', lines: 1 },
    ]);
    expect(res.body.fields.map((f: { fieldId: string; hours: string; machineCost: string; costPerAcre: string }) => [f.fieldId, f.hours, f.machineCost, f.costPerAcre])).toEqual([
      [east, '2.00', '200.00', '5.00'],
      [west, '1.00', '100.00', '10.00'],
    ]);
    expect(res.body.unallocatedMachineCost).toBe('90.00');

    const csv = await t.http().get('/api/reports/custom-income.csv?year=2025').set(bearer(o.tokens.bookkeeper));
    expect(csv.status).toBe(200);
    expect(csv.text).toContain('Work type,Adjustments,,1,,,,-50.00,');
    expect(csv.text).toContain('Field,East field,"field, 40.000 acres",,,2.00,40.000,200.00,5.00');
  });
});
