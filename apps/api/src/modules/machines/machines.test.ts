import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createOperation, signInAll, type OperationFixture } from '../../test-support/fixtures.js';
import { createTestApp, type TestApp } from '../../test-support/test-app.js';

let t: TestApp;
let fx: OperationFixture;
let other: OperationFixture;
let tokens: Awaited<ReturnType<typeof signInAll>>;
let otherTokens: Awaited<ReturnType<typeof signInAll>>;
const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });

const TRACTOR = { name: 'Tractor 7', classId: 'tractor-mfwd', year: 2016, ptoHp: 180, fuelType: 'diesel', listPrice: '210000', purchasePrice: '184500.00', purchaseDate: '2016-04-12', hoursAtPurchase: 12 };

beforeAll(async () => {
  t = await createTestApp();
  fx = await createOperation(t.dbh.db);
  other = await createOperation(t.dbh.db, 'Elsewhere');
  tokens = await signInAll(t, fx);
  otherTokens = await signInAll(t, other);
});
afterAll(() => t.close());

const create = (token: string, body: Record<string, unknown>) => t.http().post('/api/machines').set(bearer(token)).send(body);
const [hA, hB] = [() => fx.households[0], () => fx.households[1]];

describe('machines', () => {
  it('creates a jointly owned tractor whose kind follows its class, with prices as strings', async () => {
    const res = await create(tokens.owner, { ...TRACTOR, owners: [{ partyId: hA(), sharePct: 50 }, { partyId: hB(), sharePct: '50' }] });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ kind: 'power', classLabel: 'Tractor, mechanical front-wheel drive', ptoHp: '180.0', listPrice: '210000.00', purchasePrice: '184500.00', hoursAtPurchase: '12.0', status: 'active' });
    expect(res.body.owners.map((o: { partyId: string; sharePct: string }) => [o.partyId, o.sharePct]).sort()).toEqual([[hA(), '50.0000'], [hB(), '50.0000']].sort());
  });

  it('shows operators machines without any price, and the bookkeeper with them', async () => {
    const made = await create(tokens.owner, { ...TRACTOR, name: 'Priced one' });
    const asOperator = await t.http().get(`/api/machines/${made.body.id}`).set(bearer(tokens.operator));
    expect(asOperator.status).toBe(200);
    expect(asOperator.body).not.toHaveProperty('listPrice');
    expect(asOperator.body).not.toHaveProperty('purchasePrice');
    const list = await t.http().get('/api/machines').set(bearer(tokens.operator));
    expect(list.body.items.length).toBeGreaterThan(0);
    expect(list.body.items.some((m: Record<string, unknown>) => 'listPrice' in m || 'purchasePrice' in m)).toBe(false);
    const asBookkeeper = await t.http().get(`/api/machines/${made.body.id}`).set(bearer(tokens.bookkeeper));
    expect(asBookkeeper.body.listPrice).toBe('210000.00');
  });

  it('lets the bookkeeper change nothing and the customer see nothing', async () => {
    const made = await create(tokens.owner, { ...TRACTOR, name: 'Hands off' });
    expect((await create(tokens.bookkeeper, TRACTOR)).status).toBe(403);
    expect((await create(tokens.operator, TRACTOR)).status).toBe(403);
    expect((await t.http().patch(`/api/machines/${made.body.id}`).set(bearer(tokens.bookkeeper)).send({ name: 'Renamed' })).status).toBe(403);
    expect((await t.http().get('/api/machines').set(bearer(tokens.customer))).status).toBe(403);
    expect((await t.http().get(`/api/machines/${made.body.id}`).set(bearer(tokens.customer))).status).toBe(403);
    const row = await t.dbh.db.query.machines.findFirst({ where: (m, { eq }) => eq(m.id, made.body.id) });
    expect(row?.name).toBe('Hands off');
  });

  it('names every bad field: engine rules by class, cents, unknown fields', async () => {
    const tractor = await create(tokens.owner, { name: 'No hp', classId: 'tractor-2wd', listPrice: '12.345', colour: 'red' });
    expect(tractor.status).toBe(400);
    expect(tractor.body.issues.map((i: { path: string }) => i.path).sort()).toEqual(['colour', 'listPrice', 'ptoHp']);
    const implement = await create(tokens.owner, { name: 'Disk', classId: 'tandem-disk', ptoHp: 100, fuelType: 'diesel' });
    expect(implement.body.issues.map((i: { path: string }) => i.path).sort()).toEqual(['fuelType', 'ptoHp']);
    const made = await create(tokens.owner, { ...TRACTOR, name: 'Reclassed' });
    const reclassed = await t.http().patch(`/api/machines/${made.body.id}`).set(bearer(tokens.owner)).send({ classId: 'grain-cart' });
    expect(reclassed.status).toBe(400);
    expect(reclassed.body.issues.map((i: { path: string }) => i.path).sort()).toEqual(['fuelType', 'ptoHp']);
    const fixed = await t.http().patch(`/api/machines/${made.body.id}`).set(bearer(tokens.owner)).send({ classId: 'grain-cart', ptoHp: null, fuelType: null });
    expect(fixed.status).toBe(200);
    expect(fixed.body).toMatchObject({ classId: 'grain-cart', kind: 'implement', ptoHp: null });
  });

  it('lets a partner change only machines its household has a share of, and own what it adds', async () => {
    const ours = await create(tokens.owner, { ...TRACTOR, name: 'Shared with B', owners: [{ partyId: hA(), sharePct: 60 }, { partyId: hB(), sharePct: 40 }] });
    const theirs = await create(tokens.owner, { ...TRACTOR, name: 'A only', owners: [{ partyId: hA(), sharePct: 100 }] });
    expect((await t.http().patch(`/api/machines/${ours.body.id}`).set(bearer(tokens.partner)).send({ notes: 'New tyres' })).status).toBe(200);
    const refused = await t.http().patch(`/api/machines/${theirs.body.id}`).set(bearer(tokens.partner)).send({ notes: 'Mine now' });
    expect(refused.status).toBe(403);
    expect((await t.http().get(`/api/machines/${theirs.body.id}`).set(bearer(tokens.partner))).body.notes).toBeNull();

    const added = await create(tokens.partner, { name: 'Partner’s mower', classId: 'rotary-mower', widthFt: 15 });
    expect(added.status).toBe(201);
    expect(added.body.owners).toEqual([expect.objectContaining({ partyId: hB(), sharePct: '100.0000' })]);
    const forOthers = await create(tokens.partner, { name: 'Not mine', classId: 'wagon', owners: [{ partyId: hA(), sharePct: 100 }] });
    expect(forOthers.status).toBe(400);
    expect(forOthers.body.issues[0].path).toBe('owners');
  });

  it('lists on the server with paging, sorting and filters by status, kind, class, owner and text', async () => {
    const tag = `Q${Date.now()}`;
    await create(tokens.owner, { name: `${tag} Alpha`, classId: 'grain-drill', year: 2005, owners: [{ partyId: hA(), sharePct: 100 }] });
    const beta = await create(tokens.owner, { name: `${tag} Beta`, classId: 'grain-drill', year: 2012, owners: [{ partyId: hB(), sharePct: 100 }] });
    const gamma = await create(tokens.owner, { ...TRACTOR, name: `${tag} Gamma`, serialNumber: `SN-${tag}` });
    await t.http().patch(`/api/machines/${gamma.body.id}`).set(bearer(tokens.owner)).send({ status: 'sold' });

    const byYear = await t.http().get(`/api/machines?q=${tag}&sort=-year&pageSize=2`).set(bearer(tokens.owner));
    expect(byYear.body).toMatchObject({ total: 3, page: 1, pageSize: 2 });
    expect(byYear.body.items.map((m: { name: string }) => m.name)).toEqual([`${tag} Gamma`, `${tag} Beta`]);
    const page2 = await t.http().get(`/api/machines?q=${tag}&sort=-year&pageSize=2&page=2`).set(bearer(tokens.owner));
    expect(page2.body.items.map((m: { name: string }) => m.name)).toEqual([`${tag} Alpha`]);
    const drills = await t.http().get(`/api/machines?q=${tag}&classId=grain-drill&kind=implement`).set(bearer(tokens.owner));
    expect(drills.body.total).toBe(2);
    const sold = await t.http().get(`/api/machines?q=${tag}&status=sold`).set(bearer(tokens.owner));
    expect(sold.body.items.map((m: { id: string }) => m.id)).toEqual([gamma.body.id]);
    const ownedByB = await t.http().get(`/api/machines?q=${tag}&ownerPartyId=${hB()}`).set(bearer(tokens.owner));
    expect(ownedByB.body.items.map((m: { id: string }) => m.id)).toEqual([beta.body.id]);
    const bySerial = await t.http().get(`/api/machines?q=SN-${tag}`).set(bearer(tokens.owner));
    expect(bySerial.body.total).toBe(1);
    const bad = await t.http().get('/api/machines?status=scrapped&sort=price&page=1&page=2').set(bearer(tokens.owner));
    expect(bad.status).toBe(400);
    expect(bad.body.issues.map((i: { path: string }) => i.path).sort()).toEqual(['page', 'sort', 'status']);
    // A NUL character is refused at its field before anything else is read.
    const nul = await t.http().get('/api/machines?q=%00').set(bearer(tokens.owner));
    expect(nul.status).toBe(400);
    expect(nul.body.issues.map((i: { path: string }) => i.path)).toEqual(['q']);
  });

  it("lists each machine's newest meter reading, the same one its meter history starts with", async () => {
    const tag = `M${Date.now()}`;
    const ids: string[] = [];
    for (const name of ['A', 'B', 'C', 'D']) ids.push((await create(tokens.owner, { ...TRACTOR, name: `${tag} ${name}` })).body.id);
    const [early, replaced, tied, never] = ids as [string, string, string, string];
    const read = (id: string, body: Record<string, unknown>) => t.http().post(`/api/machines/${id}/meter-readings`).set(bearer(tokens.owner)).send(body);
    // Entered out of time order: the newest by time wins, not the newest typed.
    expect((await read(early, { readAt: '2025-05-02T08:00:00Z', hours: '1310.5' })).status).toBe(201);
    expect((await read(early, { readAt: '2025-04-01T08:00:00Z', hours: '1290' })).status).toBe(201);
    expect((await read(replaced, { readAt: '2025-03-01T08:00:00Z', hours: '4212' })).status).toBe(201);
    expect((await read(replaced, { readAt: '2025-03-05T08:00:00Z', hours: 0, kind: 'reset', offsetHours: '4212' })).status).toBe(201);
    expect((await read(replaced, { readAt: '2025-03-09T08:00:00Z', hours: '12.5' })).status).toBe(201);
    // Two readings at the same moment: the one entered later counts, as in the history.
    expect((await read(tied, { readAt: '2025-06-01T08:00:00Z', hours: '88' })).status).toBe(201);
    expect((await read(tied, { readAt: '2025-06-01T08:00:00Z', hours: '88.4' })).status).toBe(201);

    const list = await t.http().get(`/api/machines?q=${tag}&sort=name`).set(bearer(tokens.operator));
    expect(list.status).toBe(200);
    const listed = new Map(list.body.items.map((m: { id: string; lastReading: unknown }) => [m.id, m.lastReading]));
    expect(listed.get(early)).toEqual({ readAt: '2025-05-02T08:00:00.000Z', hours: '1310.5', totalHours: '1310.5' });
    expect(listed.get(replaced)).toEqual({ readAt: '2025-03-09T08:00:00.000Z', hours: '12.5', totalHours: '4224.5' });
    expect(listed.get(tied)).toMatchObject({ hours: '88.4' });
    expect(listed.get(never)).toBeNull();
    for (const id of ids) {
      const history = await t.http().get(`/api/machines/${id}/meter-readings?pageSize=1`).set(bearer(tokens.operator));
      const first = history.body.items[0];
      expect(listed.get(id)).toEqual(first ? { readAt: first.readAt, hours: first.hours, totalHours: first.totalHours } : null);
      expect((await t.http().get(`/api/machines/${id}`).set(bearer(tokens.operator))).body.lastReading).toEqual(listed.get(id));
    }
  });

  it('exports the filtered fleet as CSV in the table order, with prices only for money roles', async () => {
    const tag = `X${Date.now()}`;
    await create(tokens.owner, { ...TRACTOR, name: `${tag} Tractor`, owners: [{ partyId: hA(), sharePct: 60 }, { partyId: hB(), sharePct: 40 }] });
    await create(tokens.owner, { name: `${tag} Drill`, classId: 'grain-drill', year: 2011, owners: [{ partyId: hB(), sharePct: 100 }] });
    const rows = (res: { text: string }) => res.text.replace(/^\uFEFF/, '').trim().split(/\r?\n/);

    const owner = await t.http().get(`/api/machines/export.csv?q=${tag}&sort=-year`).set(bearer(tokens.owner));
    expect(owner.status).toBe(200);
    expect(owner.headers['content-type']).toContain('text/csv');
    const [header, first, second] = rows(owner);
    expect(header).toBe('name,class,kind,status,year,make,model,unit number,serial number,pto hp,fuel,owners,hour meter,list price,purchase price');
    expect(first).toContain(`${tag} Tractor`);
    expect(first).toMatch(/,2016,/);
    expect(first).toMatch(/Household A \S+ 60 %; Household B \S+ 40 %/);
    expect(first).toMatch(/,210000(\.00)?,184500\.00$/);
    expect(second).toContain(`${tag} Drill`);
    expect(rows(owner)).toHaveLength(3);

    const operator = await t.http().get(`/api/machines/export.csv?q=${tag}&kind=implement`).set(bearer(tokens.operator));
    expect(rows(operator)[0]).not.toContain('price');
    expect(rows(operator)).toHaveLength(2);
    expect((await t.http().get('/api/machines/export.csv').set(bearer(tokens.customer))).status).toBe(403);
    expect(rows(await t.http().get(`/api/machines/export.csv?q=${tag}`).set(bearer(otherTokens.owner)))).toHaveLength(1);
  });

  it('deletes a machine entered by mistake but not one with history (409, then sold or retired)', async () => {
    const mistake = await create(tokens.owner, { name: 'Typo', classId: 'wagon', owners: [{ partyId: hA(), sharePct: 100 }] });
    expect((await t.http().delete(`/api/machines/${mistake.body.id}`).set(bearer(tokens.owner))).status).toBe(204);
    expect((await t.http().get(`/api/machines/${mistake.body.id}`).set(bearer(tokens.owner))).status).toBe(404);

    const used = await create(tokens.owner, { ...TRACTOR, name: 'Worked' });
    await t.http().post(`/api/machines/${used.body.id}/meter-readings`).set(bearer(tokens.operator)).send({ hours: 100 });
    const refused = await t.http().delete(`/api/machines/${used.body.id}`).set(bearer(tokens.owner));
    expect(refused.status).toBe(409);
    expect(refused.body.message).toMatch(/sold or retired/);
    const retired = await t.http().patch(`/api/machines/${used.body.id}`).set(bearer(tokens.owner)).send({ status: 'retired' });
    expect(retired.body.status).toBe('retired');
  });

  it('takes a photo only from a machine-photo upload of the same operation', async () => {
    const made = await create(tokens.owner, { ...TRACTOR, name: 'Photogenic' });
    const png = Buffer.from('89504e470d0a1a0a0000000d4948445200000001000000010802000000907753de0000000c4944415408d763f8ffff3f0005fe02fea7d6a4c90000000049454e44ae426082', 'hex');
    const photo = await t.http().post('/api/uploads').set(bearer(tokens.owner)).field('purpose', 'machine-photo').attach('file', png, 'front.png');
    const receipt = await t.http().post('/api/uploads').set(bearer(tokens.owner)).field('purpose', 'receipt').attach('file', png, 'r.png');
    const theirs = await t.http().post('/api/uploads').set(bearer(otherTokens.owner)).field('purpose', 'machine-photo').attach('file', png, 'x.png');
    expect((await t.http().patch(`/api/machines/${made.body.id}`).set(bearer(tokens.owner)).send({ photoUploadId: photo.body.id })).body.photoUploadId).toBe(photo.body.id);
    for (const wrong of [receipt.body.id, theirs.body.id]) {
      const res = await t.http().patch(`/api/machines/${made.body.id}`).set(bearer(tokens.owner)).send({ photoUploadId: wrong });
      expect(res.status).toBe(400);
      expect(res.body.issues[0].path).toBe('photoUploadId');
    }
  });

  it("answers 404 for another operation's machine on every route and changes nothing", async () => {
    const theirs = await create(otherTokens.owner, { ...TRACTOR, name: 'Their tractor', owners: [{ partyId: other.households[0], sharePct: 100 }] });
    const id = theirs.body.id as string;
    const owner = bearer(tokens.owner);
    expect((await t.http().get(`/api/machines/${id}`).set(owner)).status).toBe(404);
    expect((await t.http().get(`/api/machines/${id}/summary`).set(owner)).status).toBe(404);
    expect((await t.http().patch(`/api/machines/${id}`).set(owner).send({ name: 'Taken over' })).status).toBe(404);
    expect((await t.http().delete(`/api/machines/${id}`).set(owner)).status).toBe(404);
    expect((await t.http().put(`/api/machines/${id}/shares`).set(owner).send({ effectiveFrom: '2025-01-01', shares: [{ partyId: hA(), sharePct: 100 }] })).status).toBe(404);
    expect((await t.http().post(`/api/machines/${id}/meter-readings`).set(owner).send({ hours: 5 })).status).toBe(404);
    expect((await t.http().post(`/api/machines/${id}/costs`).set(owner).send({ category: 'repair', incurredOn: '2025-01-02', amount: 10, paidByPartyId: hA() })).status).toBe(404);
    expect((await t.http().get(`/api/machines/${id}/costs`).set(owner)).status).toBe(404);
    const row = await t.dbh.db.query.machines.findFirst({ where: (m, { eq }) => eq(m.id, id) });
    expect(row?.name).toBe('Their tractor');
    const shares = await t.dbh.db.query.machineShares.findMany({ where: (s, { eq }) => eq(s.machineId, id) });
    expect(shares.map((s) => s.partyId)).toEqual([other.households[0]]);
    const readings = await t.dbh.db.query.meterReadings.findMany({ where: (r, { eq }) => eq(r.machineId, id) });
    expect(readings).toEqual([]);
  });
});
