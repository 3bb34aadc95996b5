import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createOperation, signInAll, type OperationFixture } from '../../test-support/fixtures.js';
import { createTestApp, type TestApp } from '../../test-support/test-app.js';
import { createBillingWorld, type BillingWorld } from '../invoices/billing-world.fixture.js';

let t: TestApp;
let world: BillingWorld<OperationFixture>;
let elsewhere: BillingWorld<OperationFixture>;
let tokens: Awaited<ReturnType<typeof signInAll>>;
const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });

beforeAll(async () => {
  t = await createTestApp();
  world = await createBillingWorld(t.dbh.db, await createOperation(t.dbh.db));
  elsewhere = await createBillingWorld(t.dbh.db, await createOperation(t.dbh.db, 'Elsewhere'));
  tokens = await signInAll(t, world.fx);
});
afterAll(() => t.close());

function neighbourSheet(extra: Record<string, unknown> = {}) {
  return {
    name: 'Neighbour rates 2025',
    relationship: 'neighbour',
    effectiveFrom: '2025-01-01',
    minimumCharge: '75.00',
    travelFlat: 25,
    fuelAdjustment: { basePricePerGallon: '3.50', stepPerGallon: '0.25', pctPerStep: '2' },
    termsDays: 21,
    lines: [
      { workTypeId: world.workTypes.mowing, unit: 'acre', rate: '18.50' },
      { workTypeId: world.workTypes.cart, unit: 'hour', chargeType: 'rental', rate: '65', minimumCharge: '100' },
    ],
    machineRates: [{ machineId: world.machines.tractor, ratePerHour: '42.1250' }],
    ...extra,
  };
}

describe('rate sheets', () => {
  it('lets the owner create a sheet with rate lines and machine-hour rates, and reads it back as decimal strings', async () => {
    const created = await t.http().post('/api/rate-sheets').set(bearer(tokens.owner)).send(neighbourSheet());
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({
      name: 'Neighbour rates 2025',
      relationship: 'neighbour',
      partyId: null,
      minimumCharge: '75.00',
      minimumPer: 'entry',
      travelFlat: '25.00',
      fuelAdjustment: { basePricePerGallon: '3.5000', stepPerGallon: '0.2500', pctPerStep: '2.0000' },
      laborFactor: '1.100',
      termsDays: 21,
    });
    expect(created.body.lines).toEqual(
      expect.arrayContaining([
        expect.objectContaining({ workTypeName: 'Mowing (rotary)', unit: 'acre', chargeType: 'custom', rate: '18.5000', minimumCharge: null }),
        expect.objectContaining({ workTypeName: 'Grain cart', unit: 'hour', chargeType: 'rental', rate: '65.0000', minimumCharge: '100.00' }),
      ]),
    );
    expect(created.body.machineRates).toEqual([expect.objectContaining({ machineName: 'Tractor 7', ratePerHour: '42.1250' })]);

    for (const role of ['partner', 'bookkeeper'] as const) {
      const read = await t.http().get(`/api/rate-sheets/${created.body.id}`).set(bearer(tokens[role]));
      expect(read.status, role).toBe(200);
      expect(read.body.lines).toHaveLength(2);
    }
    const list = await t.http().get('/api/rate-sheets?relationship=neighbour').set(bearer(tokens.bookkeeper));
    expect(list.body).toMatchObject({ total: 1, page: 1, pageSize: 25 });
    expect(list.body.items[0]).toMatchObject({ id: created.body.id, lineCount: 2 });
  });

  it('refuses writes to partners and bookkeepers and everything to operators and customers', async () => {
    for (const role of ['partner', 'bookkeeper', 'operator', 'customer'] as const) {
      expect((await t.http().post('/api/rate-sheets').set(bearer(tokens[role])).send(neighbourSheet({ effectiveFrom: '2026-01-01' }))).status, role).toBe(403);
    }
    for (const role of ['operator', 'customer'] as const) {
      expect((await t.http().get('/api/rate-sheets').set(bearer(tokens[role]))).status, role).toBe(403);
    }
    const rows = await t.dbh.db.query.rateSheets.findMany({ where: (s, { and, eq }) => and(eq(s.operationId, world.fx.operationId), eq(s.effectiveFrom, '2026-01-01')) });
    expect(rows).toHaveLength(0);
  });

  it('names every bad field, including ids of another operation, and stores nothing', async () => {
    const res = await t.http()
      .post('/api/rate-sheets')
      .set(bearer(tokens.owner))
      .send({
        name: '',
        relationship: 'cousin',
        effectiveFrom: '2025-02-30',
        minimumCharge: '12.345',
        termsDays: 10.5,
        colour: 'red',
        lines: [
          { workTypeId: world.workTypes.mowing, unit: 'acre', rate: '-1' },
          { workTypeId: world.workTypes.mowing, unit: 'acre', rate: '1e3' },
        ],
      });
    expect(res.status).toBe(400);
    const paths = res.body.issues.map((i: { path: string }) => i.path);
    expect(paths).toEqual(expect.arrayContaining(['name', 'relationship', 'effectiveFrom', 'minimumCharge', 'termsDays', 'colour', 'lines.0.rate', 'lines.1.rate']));

    const foreign = await t.http()
      .post('/api/rate-sheets')
      .set(bearer(tokens.owner))
      .send(neighbourSheet({ effectiveFrom: '2027-01-01', lines: [{ workTypeId: elsewhere.workTypes.mowing, unit: 'acre', rate: 10 }], machineRates: [{ machineId: elsewhere.machines.tractor, ratePerHour: 1 }] }));
    expect(foreign.status).toBe(400);
    expect(foreign.body.issues.map((i: { path: string }) => i.path).sort()).toEqual(['lines.0.workTypeId', 'machineRates.0.machineId']);
    const stored = await t.dbh.db.query.rateSheets.findMany({ where: (s, { eq }) => eq(s.effectiveFrom, '2027-01-01') });
    expect(stored).toHaveLength(0);
  });

  it("ties an override sheet to one party of the sheet's relationship", async () => {
    const wrong = await t.http().post('/api/rate-sheets').set(bearer(tokens.owner)).send(neighbourSheet({ name: 'Agency special', relationship: 'agency', partyId: world.fx.customers[0] }));
    expect(wrong.status).toBe(400);
    expect(wrong.body.issues).toEqual([expect.objectContaining({ path: 'relationship' })]);
    const foreignParty = await t.http().post('/api/rate-sheets').set(bearer(tokens.owner)).send(neighbourSheet({ partyId: elsewhere.fx.customers[0] }));
    expect(foreignParty.status).toBe(400);
    expect(foreignParty.body.issues).toEqual([expect.objectContaining({ path: 'partyId' })]);
  });

  it('refuses a second live sheet starting the same day for the same relationship, until the first is archived', async () => {
    const first = await t.http().post('/api/rate-sheets').set(bearer(tokens.owner)).send({ name: 'Family 2025', relationship: 'family', effectiveFrom: '2025-03-01' });
    expect(first.status).toBe(201);
    const second = await t.http().post('/api/rate-sheets').set(bearer(tokens.owner)).send({ name: 'Family 2025 again', relationship: 'family', effectiveFrom: '2025-03-01' });
    expect(second.status).toBe(409);

    const archived = await t.http().delete(`/api/rate-sheets/${first.body.id}`).set(bearer(tokens.owner));
    expect(archived.status).toBe(200);
    expect(archived.body.archivedAt).not.toBeNull();
    expect((await t.http().post('/api/rate-sheets').set(bearer(tokens.owner)).send({ name: 'Family 2025 again', relationship: 'family', effectiveFrom: '2025-03-01' })).status).toBe(201);
    const live = await t.http().get('/api/rate-sheets?relationship=family').set(bearer(tokens.owner));
    expect(live.body.items.map((s: { name: string }) => s.name)).toEqual(['Family 2025 again']);
    const all = await t.http().get('/api/rate-sheets?relationship=family&includeArchived=true').set(bearer(tokens.owner));
    expect(all.body.total).toBe(2);
  });

  it('replaces the lines on update and keeps the fields left out', async () => {
    const created = await t.http().post('/api/rate-sheets').set(bearer(tokens.owner)).send(neighbourSheet({ name: 'To edit', effectiveFrom: '2028-01-01' }));
    const edited = await t.http()
      .patch(`/api/rate-sheets/${created.body.id}`)
      .set(bearer(tokens.owner))
      .send({ lines: [{ workTypeId: world.workTypes.hauling, unit: 'load', rate: '12' }], fuelAdjustment: null });
    expect(edited.status).toBe(200);
    expect(edited.body).toMatchObject({ name: 'To edit', termsDays: 21, fuelAdjustment: null });
    expect(edited.body.lines).toEqual([expect.objectContaining({ workTypeName: 'Hauling', unit: 'load', rate: '12.0000' })]);
    expect(edited.body.machineRates).toHaveLength(1);
    expect((await t.http().patch(`/api/rate-sheets/${created.body.id}`).set(bearer(tokens.owner)).send({})).status).toBe(400);
  });

  it("finds the party's override sheet in force on a date, else the relationship's sheet", async () => {
    const party = world.fx.customers[0];
    const override = await t.http()
      .post('/api/rate-sheets')
      .set(bearer(tokens.owner))
      .send(neighbourSheet({ name: 'Special for one neighbour', partyId: party, effectiveFrom: '2025-06-01' }));
    expect(override.status).toBe(201);

    const before = await t.http().get(`/api/rate-sheets/in-force?partyId=${party}&date=2025-05-31`).set(bearer(tokens.partner));
    expect(before.status).toBe(200);
    expect(before.body).toMatchObject({ source: 'relationship', sheet: { name: 'Neighbour rates 2025' } });
    const after = await t.http().get(`/api/rate-sheets/in-force?partyId=${party}&date=2025-06-01`).set(bearer(tokens.partner));
    expect(after.body).toMatchObject({ source: 'party-override', sheet: { id: override.body.id } });
    const none = await t.http().get(`/api/rate-sheets/in-force?partyId=${party}&date=2024-12-31`).set(bearer(tokens.partner));
    expect(none.status).toBe(404);
  });

  it("answers 404 for another operation's sheet and leaves it alone", async () => {
    const theirs = await t.http().post('/api/rate-sheets').set(bearer((await signInAll(t, elsewhere.fx)).owner)).send({ name: 'Theirs', relationship: 'agency', effectiveFrom: '2025-01-01' });
    expect(theirs.status).toBe(201);
    expect((await t.http().get(`/api/rate-sheets/${theirs.body.id}`).set(bearer(tokens.owner))).status).toBe(404);
    expect((await t.http().patch(`/api/rate-sheets/${theirs.body.id}`).set(bearer(tokens.owner)).send({ name: 'Mine now' })).status).toBe(404);
    expect((await t.http().delete(`/api/rate-sheets/${theirs.body.id}`).set(bearer(tokens.owner))).status).toBe(404);
    const [row] = await t.dbh.db.query.rateSheets.findMany({ where: (s, { eq }) => eq(s.id, theirs.body.id) });
    expect(row).toMatchObject({ name: 'Theirs', archivedAt: null });
  });
});
