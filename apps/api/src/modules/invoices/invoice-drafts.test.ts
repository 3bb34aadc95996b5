import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { invoiceEntries, workEntries } from '@hitchbook/db';
import { createOperation, signInAll, type OperationFixture } from '../../test-support/fixtures.js';
import { createTestApp, type TestApp } from '../../test-support/test-app.js';
import { addEntry, addNeighbourSheet, addSheet, createBillingWorld, type BillingWorld } from './billing-world.fixture.js';

let t: TestApp;
let world: BillingWorld<OperationFixture>;
let tokens: Awaited<ReturnType<typeof signInAll>>;
let neighbour: string;
const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });

beforeAll(async () => {
  t = await createTestApp();
  world = await createBillingWorld(t.dbh.db, await createOperation(t.dbh.db));
  tokens = await signInAll(t, world.fx);
  neighbour = world.fx.customers[0];
  await addNeighbourSheet(t.dbh.db, world);
});
afterAll(() => t.close());

const mowing = (workDate: string, acres: string, extra: Record<string, unknown> = {}) =>
  addEntry(t.dbh.db, world, { workDate, workTypeId: world.workTypes.mowing, fieldId: world.fields.creekBottom, billToPartyId: neighbour, hours: '3.00', acres, ...extra });

describe('invoice drafts', () => {
  it("drafts the party's approved, unbilled entries in the range, priced line by line", async () => {
    const big = await mowing('2025-04-02', '38.500');
    const small = await mowing('2025-04-02', '3.200', { fieldId: world.fields.schoolhouse });
    const ditch = await addEntry(t.dbh.db, world, { workDate: '2025-04-09', workTypeId: world.workTypes.roadside, fieldId: world.fields.ditch, billToPartyId: neighbour, hours: '2.00', miles: '2.500' });
    // Not billed: not yet approved, outside the range, or for another party.
    await mowing('2025-04-03', '10', { state: 'submitted' });
    await mowing('2025-05-01', '10');
    await mowing('2025-04-04', '10', { billToPartyId: world.fx.customers[1] });

    const res = await t.http().post('/api/invoices/drafts').set(bearer(tokens.owner)).send({ partyId: neighbour, from: '2025-04-01', to: '2025-04-30', notes: 'April work' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ status: 'draft', state: 'draft', number: null, numberLabel: null, partyId: neighbour, periodFrom: '2025-04-01', periodTo: '2025-04-30', termsDays: 21, notes: 'April work', balance: '0.00', payUrl: null });
    // Hand-worked: 38.5 × 18.50 = 712.25; 3.2 × 18.50 = 59.20, topped up by 15.80 to the 75.00 minimum;
    // travel 25.00 for the visit of 2 April; 2.5 miles × 45.00 = 112.50 and travel 25.00 on 9 April.
    expect(res.body.lines.map((l: Record<string, unknown>) => [l.kind, l.workEntryId, l.workDate, l.quantity, l.unit, l.rate, l.amount])).toEqual([
      ['work', big, '2025-04-02', '38.500', 'acre', '18.5000', '712.25'],
      ['work', small, '2025-04-02', '3.200', 'acre', '18.5000', '59.20'],
      ['minimum', small, '2025-04-02', '1.000', 'each', '15.8000', '15.80'],
      ['travel', null, '2025-04-02', '1.000', 'trip', '25.0000', '25.00'],
      ['work', ditch, '2025-04-09', '2.500', 'mile', '45.0000', '112.50'],
      ['travel', null, '2025-04-09', '1.000', 'trip', '25.0000', '25.00'],
    ]);
    expect(res.body.lines[0]).toMatchObject({ fieldName: 'Creek Bottom', workTypeName: 'Mowing (rotary)', description: 'Mowing (rotary)' });
    expect(res.body).toMatchObject({ subtotal: '949.75', total: '949.75' });
    // The office's view counts the entries the lines bill and does not list them again.
    expect(res.body.entryCount).toBe(3);
    expect(res.body).not.toHaveProperty('entries');
    expect(res.body.lines[4]).toMatchObject({ workEntryId: ditch, fieldName: 'Tamarack Road ditch', workTypeName: 'Roadside mowing' });
    expect(res.body.party).toMatchObject({ name: expect.stringContaining('Neighbour C') });
  });

  it('explains why nothing can be drafted, naming the field', async () => {
    const none = await t.http().post('/api/invoices/drafts').set(bearer(tokens.owner)).send({ partyId: neighbour, from: '2030-01-01', to: '2030-01-31' });
    expect(none.status).toBe(400);
    expect(none.body.issues).toEqual([expect.objectContaining({ path: 'partyId', message: expect.stringContaining('No approved, unbilled work entries') })]);
    const household = await t.http().post('/api/invoices/drafts').set(bearer(tokens.owner)).send({ partyId: world.fx.households[0], from: '2025-01-01', to: '2025-12-31' });
    expect(household.status).toBe(400);
    expect(household.body.issues[0].path).toBe('partyId');
    const bad = await t.http().post('/api/invoices/drafts').set(bearer(tokens.owner)).send({ partyId: 'nope', from: '2025-05-01', to: '2025-04-01', amount: 5 });
    expect(bad.status).toBe(400);
    expect(bad.body.issues.map((i: { path: string }) => i.path).sort()).toEqual(['amount', 'partyId', 'to']);
  });

  it('names each entry it cannot price and stores no draft', async () => {
    const cart = await addEntry(t.dbh.db, world, { workDate: '2025-06-10', workTypeId: world.workTypes.cart, fieldId: world.fields.schoolhouse, billToPartyId: neighbour, hours: '4.00' });
    const before = await t.dbh.db.query.invoices.findMany({ where: (i, { eq }) => eq(i.operationId, world.fx.operationId) });
    const res = await t.http().post('/api/invoices/drafts').set(bearer(tokens.owner)).send({ partyId: neighbour, from: '2025-06-10', to: '2025-06-10' });
    expect(res.status).toBe(400);
    expect(res.body.issues).toEqual([{ path: `entries.${cart}`, message: '"Neighbour rates 2025" has no rate for Grain cart.' }]);
    const after = await t.dbh.db.query.invoices.findMany({ where: (i, { eq }) => eq(i.operationId, world.fx.operationId) });
    expect(after).toHaveLength(before.length);
  });

  it('asks for the diesel price when the sheet adjusts for fuel, and prices the adjustment once given', async () => {
    const agency = world.fx.customers[1];
    await addSheet(t.dbh.db, world, {
      name: 'Township roads',
      relationship: 'agency',
      fuelBasePrice: '3.5000',
      fuelStep: '0.2500',
      fuelAdjustPctPerStep: '2.0000',
      lines: [{ workTypeId: world.workTypes.roadside, unit: 'mile', rate: '45.0000' }],
    });
    await addEntry(t.dbh.db, world, { workDate: '2025-07-01', workTypeId: world.workTypes.roadside, fieldId: world.fields.ditch, billToPartyId: agency, hours: '2.00', miles: '2.500' });
    const missing = await t.http().post('/api/invoices/drafts').set(bearer(tokens.owner)).send({ partyId: agency, from: '2025-07-01', to: '2025-07-31' });
    expect(missing.status).toBe(400);
    expect(missing.body.issues[0].path).toBe('dieselPricePerGallon');
    const priced = await t.http().post('/api/invoices/drafts').set(bearer(tokens.owner)).send({ partyId: agency, from: '2025-07-01', to: '2025-07-31', dieselPricePerGallon: '4.05' });
    expect(priced.status).toBe(201);
    // Two 0.25 steps over 3.50: +4 %, 45.00 → 46.80 per mile; 2.5 × 46.80 = 117.00, so 4.50 over 112.50.
    expect(priced.body.lines.map((l: { kind: string; amount: string }) => [l.kind, l.amount])).toEqual([
      ['work', '112.50'],
      ['fuel-adjustment', '4.50'],
    ]);
  });

  it('lets the owner add lines, a discount and a note, checking the version', async () => {
    await addEntry(t.dbh.db, world, { workDate: '2025-08-05', workTypeId: world.workTypes.hauling, fieldId: world.fields.schoolhouse, billToPartyId: neighbour, hours: '5.00', loads: '10' });
    const draft = await t.http().post('/api/invoices/drafts').set(bearer(tokens.owner)).send({ partyId: neighbour, from: '2025-08-01', to: '2025-08-31' });
    expect(draft.body.total).toBe('145.00'); // 10 loads × 12.00 + 25.00 travel

    const edited = await t.http()
      .patch(`/api/invoices/${draft.body.id}`)
      .set(bearer(tokens.owner))
      .send({ version: draft.body.version, notes: 'Gravel from the pit', termsDays: 10, extraLines: [{ description: 'Tarp hire', quantity: '2', unit: 'day', rate: '7.50' }], discount: { kind: 'percent', percent: '10', description: 'Good neighbour discount' } });
    expect(edited.status).toBe(200);
    // Subtotal 145.00 + 15.00 = 160.00; 10 % off is 16.00; total 144.00.
    expect(edited.body).toMatchObject({ subtotal: '160.00', total: '144.00', notes: 'Gravel from the pit', termsDays: 10, version: draft.body.version + 1 });
    expect(edited.body.lines.slice(-2).map((l: Record<string, unknown>) => [l.kind, l.description, l.amount])).toEqual([
      ['adjustment', 'Tarp hire', '15.00'],
      ['discount', 'Good neighbour discount', '-16.00'],
    ]);

    // The percent discount follows the lines when they change.
    const fewer = await t.http().patch(`/api/invoices/${draft.body.id}`).set(bearer(tokens.owner)).send({ version: edited.body.version, extraLines: [] });
    expect(fewer.body).toMatchObject({ subtotal: '145.00', total: '130.50' });

    const stale = await t.http().patch(`/api/invoices/${draft.body.id}`).set(bearer(tokens.owner)).send({ version: draft.body.version, notes: 'Lost update' });
    expect(stale.status).toBe(409);
    const tooMuch = await t.http().patch(`/api/invoices/${draft.body.id}`).set(bearer(tokens.owner)).send({ version: fewer.body.version, discount: { kind: 'amount', amount: '500', description: 'Too generous' } });
    expect(tooMuch.status).toBe(400);
    expect(tooMuch.body.issues[0].path).toBe('discount');
    const stored = await t.http().get(`/api/invoices/${draft.body.id}`).set(bearer(tokens.owner));
    expect(stored.body).toMatchObject({ total: '130.50', notes: 'Gravel from the pit' });

    expect((await t.http().patch(`/api/invoices/${draft.body.id}`).set(bearer(tokens.partner)).send({ version: fewer.body.version, notes: 'x' })).status).toBe(403);
    expect((await t.http().delete(`/api/invoices/${draft.body.id}`).set(bearer(tokens.owner))).status).toBe(204);
    expect((await t.http().get(`/api/invoices/${draft.body.id}`).set(bearer(tokens.owner))).status).toBe(404);
  });

  it('holds its entries until it is deleted: they are invoiced, cannot change, and no other draft takes them', async () => {
    const held = await mowing('2025-09-02', '12.000');
    const draft = await t.http().post('/api/invoices/drafts').set(bearer(tokens.owner)).send({ partyId: neighbour, from: '2025-09-01', to: '2025-09-30' });
    expect(draft.status).toBe(201);
    const [row] = await t.dbh.db.select({ state: workEntries.state, version: workEntries.version }).from(workEntries).where(eq(workEntries.id, held));
    expect(row).toEqual({ state: 'invoiced', version: 2 });
    expect(await t.dbh.db.select({ invoiceId: invoiceEntries.invoiceId }).from(invoiceEntries).where(eq(invoiceEntries.workEntryId, held))).toEqual([{ invoiceId: draft.body.id }]);

    const reopened = await t.http().post(`/api/work-entries/${held}/reopen`).set(bearer(tokens.owner)).send({ version: 2 });
    expect(reopened.status).toBe(409);
    expect(reopened.body.message).toContain('delete the draft');
    const second = await t.http().post('/api/invoices/drafts').set(bearer(tokens.owner)).send({ partyId: neighbour, from: '2025-09-01', to: '2025-09-30' });
    expect(second.status).toBe(400);

    expect((await t.http().delete(`/api/invoices/${draft.body.id}`).set(bearer(tokens.owner))).status).toBe(204);
    const [freed] = await t.dbh.db.select({ state: workEntries.state }).from(workEntries).where(eq(workEntries.id, held));
    expect(freed?.state).toBe('approved');
    expect(await t.dbh.db.select().from(invoiceEntries).where(eq(invoiceEntries.workEntryId, held))).toEqual([]);
    const again = await t.http().post('/api/invoices/drafts').set(bearer(tokens.owner)).send({ partyId: neighbour, from: '2025-09-01', to: '2025-09-30' });
    expect(again.status).toBe(201);
    expect(again.body.entryCount).toBe(1);
    expect(again.body.lines.filter((l: { workEntryId: string | null }) => l.workEntryId).map((l: { workEntryId: string }) => l.workEntryId)).toEqual([held]);
    await t.http().delete(`/api/invoices/${again.body.id}`).set(bearer(tokens.owner));
  });

  it('never lets anyone but the owner draft', async () => {
    for (const role of ['partner', 'bookkeeper', 'operator', 'customer'] as const) {
      expect((await t.http().post('/api/invoices/drafts').set(bearer(tokens[role])).send({ partyId: neighbour, from: '2025-04-01', to: '2025-04-30' })).status, role).toBe(403);
    }
  });
});
