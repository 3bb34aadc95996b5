import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { workEntries } from '@hitchbook/db';
import { createOperation, signInAll, type OperationFixture } from '../../test-support/fixtures.js';
import { createTestApp, type TestApp } from '../../test-support/test-app.js';

let t: TestApp;
let fx: OperationFixture;
let other: OperationFixture;
let tokens: Awaited<ReturnType<typeof signInAll>>;
let otherTokens: Awaited<ReturnType<typeof signInAll>>;
const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });

// 1 km × 1 km on WGS84 with its south-west corner at 42° N 12° E (Δlat 0.0090031°, Δlon 0.0120699°).
// @turf/area 7.4.0 gives 998,407.33 m² for it (project stack notes §2.6: turf's spherical model, R =
// 6,371,008.8 m; the WGS84 ellipsoid gives 999,930.30 m²). In international acres of 4,046.8564224 m²
// (NIST, Federal Register 85 FR 62698, 2020) that is 246.7118 acres. The corner offsets are printed to
// 7 decimals, which moves the area by a few m²; the checks allow 0.002 acres (8 m²) for that.
const KM_SQUARE = {
  type: 'Polygon',
  coordinates: [[[12, 42], [12.0120699, 42], [12.0120699, 42.0090031], [12, 42.0090031], [12, 42]]],
};

beforeAll(async () => {
  t = await createTestApp();
  fx = await createOperation(t.dbh.db);
  other = await createOperation(t.dbh.db, 'Elsewhere');
  tokens = await signInAll(t, fx);
  otherTokens = await signInAll(t, other);
});
afterAll(() => t.close());

const create = (token: string, body: Record<string, unknown>) => t.http().post('/api/fields').set(bearer(token)).send(body);

describe('fields', () => {
  it('computes boundary acres geodesically beside the entered acres', async () => {
    const res = await create(tokens.owner, { name: 'Test square', acres: '240', boundary: { type: 'Feature', properties: { source: 'gps' }, geometry: KM_SQUARE } });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ kind: 'field', acres: '240.000', hasBoundary: true });
    expect(Math.abs(Number(res.body.boundaryAcres) - 246.7118)).toBeLessThan(0.002);
    expect(res.body.boundary).toEqual(KM_SQUARE);
    // Against the ellipsoid's 999,930.30 m² (247.088 acres) turf's sphere is 0.15 % low: fine for fields.
    expect(Math.abs(Number(res.body.boundaryAcres) / 247.088 - 1)).toBeLessThan(0.002);
    const list = await t.http().get('/api/fields?q=Test%20square').set(bearer(tokens.owner));
    expect(list.body.items[0]).toMatchObject({ id: res.body.id, hasBoundary: true, boundaryAcres: res.body.boundaryAcres });
    expect(list.body.items[0]).not.toHaveProperty('boundary');
  });

  it('derives a road stretch’s acres from length and width, ignoring entered acres', async () => {
    // 1 mile × 8.25 ft = 5,280 ft × 8.25 ft = 43,560 ft² = 1 acre exactly (definitions of the mile and acre, NIST).
    const res = await create(tokens.partner, { kind: 'roadside', name: 'TR 14 north ditch', roadName: 'Township Road 14', roadFrom: 'CR 9', roadTo: 'Saltlick Lane', lengthMiles: 1, widthFt: '8.25', acres: 99 });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ kind: 'roadside', acres: '1.000', lengthMiles: '1.000', widthFt: '8.25', roadFrom: 'CR 9' });
    const longer = await t.http().patch(`/api/fields/${res.body.id}`).set(bearer(tokens.owner)).send({ lengthMiles: '2.5', widthFt: 16.5, acres: 1 });
    expect(longer.status).toBe(200);
    expect(longer.body.acres).toBe('5.000');
  });

  it('takes a boundary from an uploaded GeoJSON file', async () => {
    const file = await t.http().post('/api/uploads').set(bearer(tokens.owner)).field('purpose', 'field-boundary').attach('file', Buffer.from(JSON.stringify(KM_SQUARE)), 'square.geojson');
    expect(file.status).toBe(201);
    const res = await create(tokens.owner, { name: 'From file', acres: 245, boundaryUploadId: file.body.id });
    expect(res.status).toBe(201);
    expect(Math.abs(Number(res.body.boundaryAcres) - 246.7118)).toBeLessThan(0.002);
    const cleared = await t.http().patch(`/api/fields/${res.body.id}`).set(bearer(tokens.owner)).send({ boundary: null });
    expect(cleared.body).toMatchObject({ hasBoundary: false, boundaryAcres: null, boundary: null });
  });

  it('names every rule a field or road stretch breaks', async () => {
    const field = await create(tokens.owner, { name: 'Bad', lengthMiles: 1, colour: 'green' });
    expect(field.status).toBe(400);
    expect(field.body.issues.map((i: { path: string }) => i.path).sort()).toEqual(['acres', 'colour', 'lengthMiles']);
    const road = await create(tokens.owner, { kind: 'roadside', name: 'Ditch' });
    expect(road.body.issues.map((i: { path: string }) => i.path).sort()).toEqual(['lengthMiles', 'roadName', 'widthFt']);
    const open = await create(tokens.owner, { name: 'Open ring', acres: 3, boundary: { type: 'Polygon', coordinates: [[[12, 42], [12.01, 42], [12.01, 42.01], [12, 42.02]]] } });
    expect(open.status).toBe(400);
    expect(open.body.issues[0]).toMatchObject({ path: 'boundary.coordinates.0', message: expect.stringMatching(/end at the position it starts/) });
    const flat = await create(tokens.owner, { name: 'Flat', acres: 3, boundary: { type: 'Polygon', coordinates: [[[12, 42], [12.01, 42], [12, 42], [12, 42]]] } });
    expect(flat.status).toBe(400);
    expect(flat.body.issues[0].path).toBe('boundary');
  });

  it('keeps the kind fixed and refuses road-stretch columns on a field', async () => {
    const res = await create(tokens.owner, { name: 'Kind fixed', acres: 10 });
    const kind = await t.http().patch(`/api/fields/${res.body.id}`).set(bearer(tokens.owner)).send({ kind: 'roadside' });
    expect(kind.status).toBe(400);
    expect(kind.body.issues[0].path).toBe('kind');
    const road = await t.http().patch(`/api/fields/${res.body.id}`).set(bearer(tokens.owner)).send({ widthFt: 10 });
    expect(road.status).toBe(400);
    expect(road.body.issues[0].path).toBe('widthFt');
  });

  it('lists with paging, sorting and filters by kind, farm label, owner and archive state', async () => {
    const label = `Farm ${Date.now()}`;
    const landlord = fx.customers[0];
    const a = await create(tokens.owner, { name: 'Alder 40', acres: 40, farmLabel: label, ownerPartyId: landlord });
    const b = await create(tokens.owner, { name: 'Birch 80', acres: 80, farmLabel: label });
    const c = await create(tokens.owner, { name: 'Cedar 20', acres: 20, farmLabel: label, ownerPartyId: landlord });
    expect(a.body.ownerName).toMatch(/^Neighbour C/);
    const byAcres = await t.http().get(`/api/fields?farmLabel=${encodeURIComponent(label)}&sort=-acres&pageSize=2`).set(bearer(tokens.operator));
    expect(byAcres.status).toBe(200);
    expect(byAcres.body).toMatchObject({ total: 3, page: 1, pageSize: 2 });
    expect(byAcres.body.items.map((f: { name: string }) => f.name)).toEqual(['Birch 80', 'Alder 40']);
    const owned = await t.http().get(`/api/fields?farmLabel=${encodeURIComponent(label)}&ownerPartyId=${landlord}`).set(bearer(tokens.owner));
    expect(owned.body.items.map((f: { id: string }) => f.id)).toEqual([a.body.id, c.body.id]);
    await t.http().patch(`/api/fields/${c.body.id}`).set(bearer(tokens.owner)).send({ archived: true });
    const active = await t.http().get(`/api/fields?farmLabel=${encodeURIComponent(label)}`).set(bearer(tokens.owner));
    expect(active.body.items.map((f: { id: string }) => f.id)).toEqual([a.body.id, b.body.id]);
    const archived = await t.http().get(`/api/fields?farmLabel=${encodeURIComponent(label)}&archived=true`).set(bearer(tokens.owner));
    expect(archived.body.items.map((f: { id: string }) => f.id)).toEqual([c.body.id]);
    const roads = await t.http().get('/api/fields?kind=roadside').set(bearer(tokens.owner));
    expect(roads.body.items.every((f: { kind: string }) => f.kind === 'roadside')).toBe(true);
  });

  it('exports the filtered fields table as CSV in the table order, road stretches included, formula-like text neutralised', async () => {
    const label = `Export ${Date.now()}`;
    const landlord = fx.customers[0];
    expect((await create(tokens.owner, { name: '=SUM(A1:A9)', acres: 12, farmLabel: label, ownerPartyId: landlord, notes: 'wet corner, "north" end' })).status).toBe(201);
    expect((await create(tokens.owner, { name: 'Hollow 55', acres: 55, farmLabel: label })).status).toBe(201);
    // 1 mile × 8.25 ft = 1 acre exactly (definitions of the mile and acre, NIST).
    expect((await create(tokens.owner, { kind: 'roadside', name: 'Ditch 3', farmLabel: label, roadName: 'Quarry Road', roadFrom: 'CR 2', roadTo: 'Mill Lane', lengthMiles: 1, widthFt: '8.25' })).status).toBe(201);
    const rows = (res: { text: string }) => res.text.replace(/^\uFEFF/, '').trim().split(/\r?\n/);
    const url = (query: string) => `/api/fields/export.csv?farmLabel=${encodeURIComponent(label)}${query}`;

    const all = await t.http().get(url('&sort=-acres')).set(bearer(tokens.owner));
    expect(all.status).toBe(200);
    expect(all.headers['content-type']).toContain('text/csv');
    expect(all.headers['content-disposition']).toContain('attachment');
    const [header, ...lines] = rows(all);
    expect(header).toBe('name,kind,acres,boundary acres,owner,farm,road,from,to,length miles,width ft,archived,notes');
    expect(lines).toHaveLength(3);
    expect(lines[0]).toMatch(/^Hollow 55,field,55\.000,,,/);
    expect(lines[1]).toMatch(/^'=SUM\(A1:A9\),field,12\.000,,Neighbour C[^,]*,Export \d+,,,,,,no,"wet corner, ""north"" end"$/);
    expect(lines[2]).toMatch(/^Ditch 3,roadside,1\.000,,,Export \d+,Quarry Road,CR 2,Mill Lane,1\.000,8\.25,no,$/);

    const roads = await t.http().get(url('&kind=roadside')).set(bearer(tokens.operator));
    expect(rows(roads)).toHaveLength(2);
    const owned = await t.http().get(url(`&ownerPartyId=${landlord}`)).set(bearer(tokens.bookkeeper));
    expect(rows(owned).slice(1).map((l) => l.split(',')[0])).toEqual(["'=SUM(A1:A9)"]);
    expect((await t.http().get(url('')).set(bearer(tokens.customer))).status).toBe(403);
    expect((await t.http().get(url('&kind=orchard')).set(bearer(tokens.owner))).status).toBe(400);
    // Another operation sees none of these fields, and a filter on this operation's party is not found for it.
    expect(rows(await t.http().get(url('')).set(bearer(otherTokens.owner)))).toHaveLength(1);
    expect((await t.http().get(url(`&ownerPartyId=${landlord}`)).set(bearer(otherTokens.owner))).status).toBe(404);
  });

  it('archives instead of deleting: an old work entry keeps pointing at the field', async () => {
    const field = await create(tokens.owner, { name: 'Sold off', acres: 12 });
    const workType = await t.dbh.db.query.workTypes.findFirst({ where: (w, { and, eq }) => and(eq(w.operationId, fx.operationId), eq(w.key, 'disking')) });
    const [entry] = await t.dbh.db
      .insert(workEntries)
      .values({ operationId: fx.operationId, workDate: '2025-04-02', operatorUserId: fx.members.operator.userId, fieldId: field.body.id, workTypeId: workType!.id, hours: '2', billToPartyId: fx.households[0], state: 'approved' })
      .returning();
    const archived = await t.http().patch(`/api/fields/${field.body.id}`).set(bearer(tokens.partner)).send({ archived: true });
    expect(archived.body).toMatchObject({ archived: true, archivedAt: expect.any(String) });
    const stillThere = await t.dbh.db.query.workEntries.findFirst({ where: (w, { eq }) => eq(w.id, entry!.id) });
    expect(stillThere?.fieldId).toBe(field.body.id);
    expect((await t.http().get(`/api/fields/${field.body.id}`).set(bearer(tokens.operator))).body.name).toBe('Sold off');
  });

  it('lets operators read but only owner and partner write; customers get nothing', async () => {
    const body = { name: 'Role check', acres: 5 };
    expect((await create(tokens.bookkeeper, body)).status).toBe(403);
    expect((await create(tokens.operator, body)).status).toBe(403);
    expect((await t.http().get('/api/fields').set(bearer(tokens.customer))).status).toBe(403);
    expect((await t.http().get('/api/fields').set(bearer(tokens.bookkeeper))).status).toBe(200);
  });

  it("answers 404 for another operation's field and refuses its parties as landlords, changing nothing", async () => {
    const theirs = await create(otherTokens.owner, { name: 'Their field', acres: 30 });
    expect((await t.http().get(`/api/fields/${theirs.body.id}`).set(bearer(tokens.owner))).status).toBe(404);
    expect((await t.http().patch(`/api/fields/${theirs.body.id}`).set(bearer(tokens.owner)).send({ name: 'Taken over' })).status).toBe(404);
    const row = await t.dbh.db.query.fields.findFirst({ where: (f, { eq }) => eq(f.id, theirs.body.id) });
    expect(row?.name).toBe('Their field');
    const foreignOwner = await create(tokens.owner, { name: 'Borrowed landlord', acres: 3, ownerPartyId: other.customers[0] });
    expect(foreignOwner.status).toBe(400);
    expect(foreignOwner.body.issues[0].path).toBe('ownerPartyId');
    const theirFile = await t.http().post('/api/uploads').set(bearer(otherTokens.owner)).field('purpose', 'field-boundary').attach('file', Buffer.from(JSON.stringify(KM_SQUARE)), 's.geojson');
    const foreignFile = await create(tokens.owner, { name: 'Borrowed file', acres: 3, boundaryUploadId: theirFile.body.id });
    expect(foreignFile.status).toBe(400);
    expect(foreignFile.body.issues[0].path).toBe('boundaryUploadId');
  });
});
