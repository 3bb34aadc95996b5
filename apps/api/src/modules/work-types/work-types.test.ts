import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CAUTIONS } from '@hitchbook/shared/cautions';
import { DEFAULT_WORK_TYPES } from '@hitchbook/shared/work-types';
import { createOperation, signInAll, type OperationFixture } from '../../test-support/fixtures.js';
import { createTestApp, type TestApp } from '../../test-support/test-app.js';

let t: TestApp;
let fx: OperationFixture;
let other: OperationFixture;
let tokens: Awaited<ReturnType<typeof signInAll>>;
const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });

beforeAll(async () => {
  t = await createTestApp();
  fx = await createOperation(t.dbh.db);
  other = await createOperation(t.dbh.db, 'Elsewhere');
  tokens = await signInAll(t, fx);
});
afterAll(() => t.close());

describe('work types', () => {
  it('starts every operation with the default list, units and cautions', async () => {
    const res = await t.http().get('/api/work-types').set(bearer(tokens.operator));
    expect(res.status).toBe(200);
    expect(res.body.total).toBe(DEFAULT_WORK_TYPES.length);
    const byKey = new Map(res.body.items.map((w: { key: string }) => [w.key, w]));
    expect(byKey.get('roadside-mowing')).toMatchObject({ name: 'Roadside mowing', defaultUnit: 'mile', cautions: ['roadside', 'thrown-debris', 'pto'] });
    expect(byKey.get('anhydrous-application')).toMatchObject({ defaultUnit: 'acre', cautions: expect.arrayContaining(['anhydrous']) });
    expect(byKey.get('hauling')).toMatchObject({ defaultUnit: 'load' });
    for (const key of ['mowing-rotary', 'disking', 'field-cultivating', 'planting', 'drilling', 'side-dressing', 'spraying', 'grain-cart', 'brush-clearing', 'tiling', 'other']) {
      expect(byKey.has(key), key).toBe(true);
    }
  });

  it('has every caution defer to local codes, the label or licensed practice', () => {
    for (const caution of Object.values(CAUTIONS)) {
      expect(caution.defersTo, caution.key).toMatch(/licensed practice/);
      expect(caution.points.length, caution.key).toBeGreaterThan(0);
    }
    expect(CAUTIONS.anhydrous.points.join(' ')).toMatch(/water/);
    expect(CAUTIONS.anhydrous.points.join(' ')).toMatch(/trained handlers/i);
    expect(CAUTIONS.roadside.points.join(' ')).toMatch(/slow-moving-vehicle emblem/);
    expect(CAUTIONS.chemical.defersTo).toMatch(/label/);
  });

  it('lets owner and partner add and edit work types, keyed from the name, and refuses a duplicate key with 409', async () => {
    const created = await t.http().post('/api/work-types').set(bearer(tokens.partner)).send({ name: 'Hay raking (rotary)', defaultUnit: 'acre', cautions: ['pto'] });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ key: 'hay-raking-rotary', defaultUnit: 'acre', cautions: ['pto'], archived: false });
    const again = await t.http().post('/api/work-types').set(bearer(tokens.owner)).send({ name: 'Hay raking (rotary)', defaultUnit: 'hour' });
    expect(again.status).toBe(409);
    expect(again.body.issues[0].path).toBe('key');
    const edited = await t.http().patch(`/api/work-types/${created.body.id}`).set(bearer(tokens.owner)).send({ defaultUnit: 'hour', archived: true });
    expect(edited.status).toBe(200);
    expect(edited.body).toMatchObject({ defaultUnit: 'hour', archived: true, key: 'hay-raking-rotary' });
    const active = await t.http().get('/api/work-types?q=raking').set(bearer(tokens.owner));
    expect(active.body.total).toBe(0);
    const archived = await t.http().get('/api/work-types?q=raking&archived=true').set(bearer(tokens.owner));
    expect(archived.body.items.map((w: { id: string }) => w.id)).toEqual([created.body.id]);
  });

  it('refuses writes by bookkeeper and operator, and any access by a customer', async () => {
    const body = { name: 'Baling', defaultUnit: 'each' };
    expect((await t.http().post('/api/work-types').set(bearer(tokens.bookkeeper)).send(body)).status).toBe(403);
    expect((await t.http().post('/api/work-types').set(bearer(tokens.operator)).send(body)).status).toBe(403);
    expect((await t.http().get('/api/work-types').set(bearer(tokens.customer))).status).toBe(403);
  });

  it('names every bad field, including unknown ones and an unknown caution', async () => {
    const res = await t.http().post('/api/work-types').set(bearer(tokens.owner)).send({ name: '', defaultUnit: 'bushel', cautions: ['fire'], key: 'Not A Key', colour: 'red' });
    expect(res.status).toBe(400);
    expect(res.body.issues.map((i: { path: string }) => i.path).sort()).toEqual(['cautions.0', 'colour', 'defaultUnit', 'key', 'name']);
  });

  it("answers 404 for another operation's work type and changes nothing", async () => {
    const foreign = await t.http().get('/api/work-types').set(bearer((await signInAll(t, other)).owner));
    const target = foreign.body.items[0] as { id: string; name: string };
    expect((await t.http().get(`/api/work-types/${target.id}`).set(bearer(tokens.owner))).status).toBe(404);
    expect((await t.http().patch(`/api/work-types/${target.id}`).set(bearer(tokens.owner)).send({ name: 'Taken over' })).status).toBe(404);
    const row = await t.dbh.db.query.workTypes.findFirst({ where: (w, { eq }) => eq(w.id, target.id) });
    expect(row?.name).toBe(target.name);
  });
});
