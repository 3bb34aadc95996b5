import { afterAll, beforeAll, describe, expect, it } from 'vitest';
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

describe('parties', () => {
  it('lists households and customers of the own operation only, paged', async () => {
    const res = await t.http().get('/api/parties?pageSize=2&sort=name').set(bearer(tokens.partner));
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ total: 4, page: 1, pageSize: 2 });
    expect(res.body.items).toHaveLength(2);
    const customers = await t.http().get('/api/parties?kind=customer').set(bearer(tokens.owner));
    expect(customers.body.items.map((p: { id: string }) => p.id).sort()).toEqual([...fx.customers].sort());
  });

  it('hides contact details from operators and refuses customers', async () => {
    const res = await t.http().get('/api/parties?kind=customer').set(bearer(tokens.operator));
    expect(res.status).toBe(200);
    expect(res.body.items.every((p: { email: unknown; phone: unknown }) => p.email === null && p.phone === null)).toBe(true);
    expect((await t.http().get('/api/parties').set(bearer(tokens.customer))).status).toBe(403);
  });

  it('creates and edits a party for owner and partner, never for the bookkeeper or operator', async () => {
    const body = { kind: 'customer', name: 'Hollis Seed Plot', relationship: 'neighbour', email: 'Hollis@Example.test' };
    const created = await t.http().post('/api/parties').set(bearer(tokens.partner)).send(body);
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ name: 'Hollis Seed Plot', email: 'hollis@example.test' });
    const edited = await t.http().patch(`/api/parties/${created.body.id}`).set(bearer(tokens.owner)).send({ notes: 'Gate code at the office.' });
    expect(edited.status).toBe(200);
    expect(edited.body.notes).toBe('Gate code at the office.');
    expect((await t.http().post('/api/parties').set(bearer(tokens.bookkeeper)).send(body)).status).toBe(403);
    expect((await t.http().post('/api/parties').set(bearer(tokens.operator)).send(body)).status).toBe(403);
  });

  it('names every bad field', async () => {
    const res = await t.http().post('/api/parties').set(bearer(tokens.owner)).send({ kind: 'landlord', name: '', relationship: 'cousin', email: 'nope', operationId: other.operationId });
    expect(res.status).toBe(400);
    expect(res.body.issues.map((i: { path: string }) => i.path).sort()).toEqual(['email', 'kind', 'name', 'operationId', 'relationship']);
  });

  it("answers 404 for another operation's party, in reads and writes, and changes nothing", async () => {
    const foreign = other.customers[0];
    expect((await t.http().get(`/api/parties/${foreign}`).set(bearer(tokens.owner))).status).toBe(404);
    expect((await t.http().patch(`/api/parties/${foreign}`).set(bearer(tokens.owner)).send({ name: 'Taken over' })).status).toBe(404);
    const [row] = await t.dbh.db.query.parties.findMany({ where: (p, { eq }) => eq(p.id, foreign) });
    expect(row?.name).not.toBe('Taken over');
  });

  it('answers 400 naming the id for a malformed id', async () => {
    const res = await t.http().get('/api/parties/not-a-uuid').set(bearer(tokens.owner));
    expect(res.status).toBe(400);
    expect(res.body.issues[0].path).toBe('id');
  });
});
