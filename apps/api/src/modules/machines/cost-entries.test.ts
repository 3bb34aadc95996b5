import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createOperation, signInAll, type OperationFixture } from '../../test-support/fixtures.js';
import { createTestApp, type TestApp } from '../../test-support/test-app.js';

let t: TestApp;
let fx: OperationFixture;
let other: OperationFixture;
let tokens: Awaited<ReturnType<typeof signInAll>>;
let otherTokens: Awaited<ReturnType<typeof signInAll>>;
const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });
const PNG = Buffer.from('89504e470d0a1a0a0000000d4948445200000001000000010802000000907753de0000000c4944415408d763f8ffff3f0005fe02fea7d6a4c90000000049454e44ae426082', 'hex');

beforeAll(async () => {
  t = await createTestApp();
  fx = await createOperation(t.dbh.db);
  other = await createOperation(t.dbh.db, 'Elsewhere');
  tokens = await signInAll(t, fx);
  otherTokens = await signInAll(t, other);
});
afterAll(() => t.close());

const [hA, hB] = [() => fx.households[0], () => fx.households[1]];

async function newMachine(owners: { partyId: string; sharePct: number }[] = [{ partyId: fx.households[1], sharePct: 100 }]): Promise<string> {
  const res = await t.http().post('/api/machines').set(bearer(tokens.owner)).send({ name: `Baler ${Math.random()}`, classId: 'large-round-baler', owners });
  return res.body.id as string;
}
const add = (machineId: string, body: Record<string, unknown>, token = tokens.partner) => t.http().post(`/api/machines/${machineId}/costs`).set(bearer(token)).send(body);

describe('cost entries', () => {
  it('records fuel with gallons, repairs and improvements with their life, amounts as cent strings', async () => {
    const id = await newMachine();
    const fuel = await add(id, { category: 'fuel', incurredOn: '2025-05-02', amount: '187.45', gallons: '52.3', vendor: 'Co-op card lock', paidByPartyId: hB() });
    expect(fuel.status).toBe(201);
    expect(fuel.body).toMatchObject({ category: 'fuel', amount: '187.45', gallons: '52.300', paidByPartyId: hB(), paidByName: expect.stringMatching(/^Household B/) });
    const improvement = await add(id, { category: 'improvement', incurredOn: '2025-02-10', amount: 6400, improvementLifeYears: 4, meterHours: '812.4', notes: 'New belts and pickup' , paidByPartyId: hB() });
    expect(improvement.body).toMatchObject({ improvementLifeYears: 4, amount: '6400.00', meterHours: '812.4' });
  });

  it('needs a life for improvements and keeps gallons to fuel, on create and on a merged update', async () => {
    const id = await newMachine();
    const bad = await add(id, { category: 'improvement', incurredOn: '2025-02-10', amount: 10, gallons: 3, paidByPartyId: hB() });
    expect(bad.status).toBe(400);
    expect(bad.body.issues.map((i: { path: string }) => i.path).sort()).toEqual(['gallons', 'improvementLifeYears']);
    const cents = await add(id, { category: 'repair', incurredOn: '2025-13-01', amount: '10.005', paidByPartyId: hB() });
    expect(cents.body.issues.map((i: { path: string }) => i.path).sort()).toEqual(['amount', 'incurredOn']);
    const repair = await add(id, { category: 'repair', incurredOn: '2025-03-01', amount: 300, paidByPartyId: hB() });
    const toImprovement = await t.http().patch(`/api/machines/${id}/costs/${repair.body.id}`).set(bearer(tokens.partner)).send({ category: 'improvement' });
    expect(toImprovement.status).toBe(400);
    expect(toImprovement.body.issues[0].path).toBe('improvementLifeYears');
    const ok = await t.http().patch(`/api/machines/${id}/costs/${repair.body.id}`).set(bearer(tokens.partner)).send({ category: 'improvement', improvementLifeYears: 3, amount: '320.10' });
    expect(ok.body).toMatchObject({ category: 'improvement', improvementLifeYears: 3, amount: '320.10' });
  });

  it('pages and filters by category, dates and payer, with totals over the whole filter', async () => {
    const id = await newMachine([{ partyId: fx.households[0], sharePct: 50 }, { partyId: fx.households[1], sharePct: 50 }]);
    const rows = [
      { category: 'fuel', incurredOn: '2025-04-01', amount: '100.10', gallons: 30, paidByPartyId: hA() },
      { category: 'fuel', incurredOn: '2025-05-01', amount: '200.20', gallons: 60, paidByPartyId: hB() },
      { category: 'fuel', incurredOn: '2025-06-01', amount: '300.30', gallons: 90, paidByPartyId: hA() },
      { category: 'insurance', incurredOn: '2025-01-15', amount: '640.00', paidByPartyId: hA() },
      { category: 'fuel', incurredOn: '2024-11-01', amount: '50.00', gallons: 15, paidByPartyId: hA() },
    ];
    for (const row of rows) expect((await add(id, row, tokens.owner)).status).toBe(201);
    const page = await t.http().get(`/api/machines/${id}/costs?category=fuel&from=2025-01-01&to=2025-12-31&pageSize=2`).set(bearer(tokens.bookkeeper));
    expect(page.status).toBe(200);
    expect(page.body).toMatchObject({ total: 3, page: 1, pageSize: 2, totals: { amount: '600.60', gallons: '180.000' } });
    expect(page.body.items.map((c: { incurredOn: string }) => c.incurredOn)).toEqual(['2025-06-01', '2025-05-01']);
    const byA = await t.http().get(`/api/machines/${id}/costs?paidByPartyId=${hA()}&sort=amount`).set(bearer(tokens.owner));
    expect(byA.body.items.map((c: { amount: string }) => c.amount)).toEqual(['50.00', '100.10', '300.30', '640.00']);
    const backwards = await t.http().get(`/api/machines/${id}/costs?from=2025-06-01&to=2025-01-01`).set(bearer(tokens.owner));
    expect(backwards.status).toBe(400);
    expect(backwards.body.issues[0].path).toBe('to');
  });

  it('refuses to add, move or delete a cost dated in a closed square-up period, with 409', async () => {
    const id = await newMachine();
    const inside = await add(id, { category: 'repair', incurredOn: '2024-03-10', amount: '410.00', paidByPartyId: hB() });
    expect(inside.status).toBe(201);
    const open = await add(id, { category: 'repair', incurredOn: '2024-09-10', amount: '90.00', paidByPartyId: hB() });
    const period = await t.http().post('/api/square-ups').set(bearer(tokens.owner)).send({ name: 'Spring 2024', periodFrom: '2024-01-01', periodTo: '2024-06-30' });
    expect(period.status).toBe(201);
    expect((await t.http().post(`/api/square-ups/${period.body.id}/close`).set(bearer(tokens.owner))).status).toBe(200);

    const late = await add(id, { category: 'repair', incurredOn: '2024-04-01', amount: '55.00', paidByPartyId: hB() });
    expect(late.status).toBe(409);
    expect(late.body.message).toContain('Spring 2024');
    const costs = (machineId: string) => `/api/machines/${machineId}/costs`;
    expect((await t.http().patch(`${costs(id)}/${inside.body.id}`).set(bearer(tokens.owner)).send({ amount: '1.00' })).status).toBe(409);
    expect((await t.http().patch(`${costs(id)}/${open.body.id}`).set(bearer(tokens.owner)).send({ incurredOn: '2024-05-01' })).status).toBe(409);
    expect((await t.http().delete(`${costs(id)}/${inside.body.id}`).set(bearer(tokens.owner))).status).toBe(409);
    // After the period the books are open as before.
    expect((await t.http().patch(`${costs(id)}/${open.body.id}`).set(bearer(tokens.owner)).send({ amount: '95.00' })).status).toBe(200);
  });

  it('exports the filtered costs table as CSV, with formula-like text neutralised, to money roles only', async () => {
    const id = await newMachine();
    expect((await add(id, { category: 'fuel', incurredOn: '2025-04-02', amount: '212.40', gallons: '60', paidByPartyId: hB(), vendor: '=HYPERLINK("http://x")' })).status).toBe(201);
    expect((await add(id, { category: 'repair', incurredOn: '2025-05-09', amount: '1310.00', paidByPartyId: hB(), notes: 'new cutter bar, "heavy" duty' })).status).toBe(201);
    expect((await add(id, { category: 'fuel', incurredOn: '2024-11-20', amount: '99.99', gallons: '30', paidByPartyId: hB() })).status).toBe(201);

    const res = await t.http().get(`/api/machines/${id}/costs/export.csv?from=2025-01-01&sort=incurredOn`).set(bearer(tokens.bookkeeper));
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toContain('text/csv');
    expect(res.headers['content-disposition']).toContain('attachment');
    const lines = res.text.replace(/^\uFEFF/, '').trim().split(/\r?\n/);
    expect(lines[0]).toBe('date,category,amount,gallons,meter hours,vendor,paid by,receipt,notes');
    expect(lines).toHaveLength(3);
    expect(lines[1]).toMatch(/^2025-04-02,fuel,212\.40,60\.000,,"'=HYPERLINK\(""http:\/\/x""\)",/);
    expect(lines[2]).toMatch(/^2025-05-09,repair,1310\.00,,,,.*,"new cutter bar, ""heavy"" duty"$/);

    const fuelOnly = await t.http().get(`/api/machines/${id}/costs/export.csv?category=fuel`).set(bearer(tokens.owner));
    expect(fuelOnly.text.trim().split(/\r?\n/)).toHaveLength(3);
    expect((await t.http().get(`/api/machines/${id}/costs/export.csv`).set(bearer(tokens.operator))).status).toBe(403);
    expect((await t.http().get(`/api/machines/${id}/costs/export.csv`).set(bearer(otherTokens.owner))).status).toBe(404);
    expect((await t.http().get(`/api/machines/${id}/costs/export.csv?from=2025-06-01&to=2025-01-01`).set(bearer(tokens.owner))).status).toBe(400);
  });

  it('deletes a cost entry', async () => {
    const id = await newMachine();
    const cost = await add(id, { category: 'parts', incurredOn: '2025-03-03', amount: 42, paidByPartyId: hB() });
    expect((await t.http().delete(`/api/machines/${id}/costs/${cost.body.id}`).set(bearer(tokens.partner))).status).toBe(204);
    expect((await t.http().get(`/api/machines/${id}/costs/${cost.body.id}`).set(bearer(tokens.partner))).status).toBe(404);
  });

  it('keeps costs from operators and customers, and writes from the bookkeeper and non-owning partners', async () => {
    const ownedByA = await newMachine([{ partyId: fx.households[0], sharePct: 100 }]);
    const body = { category: 'repair', incurredOn: '2025-03-03', amount: 42, paidByPartyId: hA() };
    expect((await t.http().get(`/api/machines/${ownedByA}/costs`).set(bearer(tokens.operator))).status).toBe(403);
    expect((await t.http().get(`/api/machines/${ownedByA}/costs`).set(bearer(tokens.customer))).status).toBe(403);
    expect((await add(ownedByA, body, tokens.operator)).status).toBe(403);
    expect((await add(ownedByA, body, tokens.bookkeeper)).status).toBe(403);
    expect((await add(ownedByA, body, tokens.partner)).status).toBe(403);
    expect((await add(ownedByA, body, tokens.owner)).status).toBe(201);
    expect((await t.http().get(`/api/machines/${ownedByA}/costs`).set(bearer(tokens.partner))).body.total).toBe(1);
  });

  it('takes a household as payer and this operation’s receipt uploads only', async () => {
    const id = await newMachine();
    const receipt = await t.http().post('/api/uploads').set(bearer(tokens.partner)).field('purpose', 'receipt').attach('file', PNG, 'ticket.png');
    const photo = await t.http().post('/api/uploads').set(bearer(tokens.partner)).field('purpose', 'machine-photo').attach('file', PNG, 'side.png');
    const theirs = await t.http().post('/api/uploads').set(bearer(otherTokens.owner)).field('purpose', 'receipt').attach('file', PNG, 'theirs.png');
    const base = { category: 'tires', incurredOn: '2025-08-08', amount: 900, paidByPartyId: hB() };
    expect((await add(id, { ...base, receiptUploadId: receipt.body.id })).body.receiptUploadId).toBe(receipt.body.id);
    for (const wrong of [photo.body.id, theirs.body.id]) {
      const res = await add(id, { ...base, receiptUploadId: wrong });
      expect(res.status).toBe(400);
      expect(res.body.issues[0].path).toBe('receiptUploadId');
    }
    const customer = await add(id, { ...base, paidByPartyId: fx.customers[0] });
    expect(customer.status).toBe(400);
    expect(customer.body.issues[0]).toMatchObject({ path: 'paidByPartyId', message: expect.stringMatching(/customer/) });
    const foreign = await add(id, { ...base, paidByPartyId: other.households[0] });
    expect(foreign.body.issues[0].path).toBe('paidByPartyId');
  });

  it("answers 404 for another machine's or operation's cost and changes nothing", async () => {
    const mine = await newMachine();
    const second = await newMachine();
    const cost = await add(second, { category: 'repair', incurredOn: '2025-03-03', amount: 42, paidByPartyId: hB() });
    expect((await t.http().patch(`/api/machines/${mine}/costs/${cost.body.id}`).set(bearer(tokens.owner)).send({ amount: 1 })).status).toBe(404);
    expect((await t.http().delete(`/api/machines/${mine}/costs/${cost.body.id}`).set(bearer(tokens.owner))).status).toBe(404);
    expect((await t.http().patch(`/api/machines/${second}/costs/${cost.body.id}`).set(bearer(otherTokens.owner)).send({ amount: 1 })).status).toBe(404);
    const row = await t.dbh.db.query.costEntries.findFirst({ where: (c, { eq }) => eq(c.id, cost.body.id) });
    expect(row?.amount).toBe('42.00');
  });
});
