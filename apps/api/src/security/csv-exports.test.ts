import { eq } from 'drizzle-orm';
import Papa from 'papaparse';
import { costEntries, fields, machines, parties, workEntries, workTypes } from '@hitchbook/db';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { listRoutes } from '../common/auth/route-inventory.js';
import { addEntry, addNeighbourSheet, createBillingWorld } from '../modules/invoices/billing-world.fixture.js';
import { createOperation, signIn, type OperationFixture } from '../test-support/fixtures.js';
import { createTestApp, type TestApp } from '../test-support/test-app.js';

/**
 * Every CSV download the API offers, found from its routes, over an operation whose every free-text
 * value starts with a spreadsheet formula trigger (ASVS 5.0 1.2.10; CWE-1236).
 */
const TRIGGERS = ['=', '+', '-', '@', '\t', '\r'];
const FORMULA_START = /^[=+\-@\t\r\0]/;
const PLAIN_NUMBER = /^-?\d+(?:\.\d+)?$/;

let t: TestApp;
let fx: OperationFixture;
let owner: string;
let squareUpId: string;
let tractorId: string;

beforeAll(async () => {
  t = await createTestApp();
  fx = await createOperation(t.dbh.db, 'Formula outfit');
  const db = t.dbh.db;
  const world = await createBillingWorld(db, fx);
  await addNeighbourSheet(db, world);
  const op = fx.operationId;
  await db.update(parties).set({ name: '=HYPERLINK("http://evil.example","Household A")' }).where(eq(parties.id, fx.households[0]));
  await db.update(parties).set({ name: '+1+cmd|" /C calc"!A0' }).where(eq(parties.id, fx.households[1]));
  await db.update(parties).set({ name: '@SUM(A1:A9)' }).where(eq(parties.id, fx.customers[0]));
  await db.update(machines).set({ name: '-2+3' }).where(eq(machines.id, world.machines.tractor));
  await db.update(machines).set({ name: '\t=1' }).where(eq(machines.id, world.machines.mower));
  await db.update(fields).set({ name: '\r=1' }).where(eq(fields.id, world.fields.creekBottom));
  await db.update(workTypes).set({ name: '=cmd|"/C calc"!A0' }).where(eq(workTypes.id, world.workTypes.mowing));
  const entry = await addEntry(db, world, { workDate: '2025-06-03', workTypeId: world.workTypes.mowing, fieldId: world.fields.creekBottom, billToPartyId: fx.customers[0], hours: '2.50', acres: '20.000' });
  await db.update(workEntries).set({ notes: '=1+1, "quoted", and a comma' }).where(eq(workEntries.id, entry));
  await db.insert(costEntries).values({ operationId: op, machineId: world.machines.tractor, category: 'repair', incurredOn: '2025-05-10', amount: '112.50', vendor: '@vendor', notes: '+notes', paidByPartyId: fx.households[0] });
  tractorId = world.machines.tractor;
  owner = (await signIn(t, fx.members.owner.email)).token;
  const created = await t.http().post('/api/square-ups').set('Authorization', `Bearer ${owner}`).send({ name: '=SquareUp()', periodFrom: '2025-01-01', periodTo: '2025-12-31' });
  expect(created.status, JSON.stringify(created.body)).toBe(201);
  squareUpId = created.body.id as string;
});
afterAll(() => t?.close());

function csvRoutes() {
  return listRoutes(t.app).filter((r) => r.method === 'GET' && r.path.endsWith('.csv'));
}

describe('CSV exports', () => {
  it('are all covered here', () => {
    expect(csvRoutes().map((r) => r.path).sort()).toEqual(
      [
        '/api/fields/export.csv',
        '/api/machines/:id/costs/export.csv',
        '/api/machines/export.csv',
        '/api/reports/custom-income.csv',
        '/api/reports/machine-rates.csv',
        '/api/square-ups/:id/statement.csv',
        '/api/work-entries/export.csv',
      ].sort(),
    );
  });

  it('never start a text cell with a formula trigger, and still carry the hostile text as text', async () => {
    const neutralised: string[] = [];
    for (const route of csvRoutes()) {
      const path = route.path.replace(':id', route.path.startsWith('/api/machines') ? tractorId : squareUpId);
      const res = await t.http().get(path).query(route.path.startsWith('/api/reports') ? { year: 2025 } : {}).set('Authorization', `Bearer ${owner}`).buffer(true);
      expect(res.status, `${path}: ${res.text}`).toBe(200);
      expect(res.headers['content-type']).toMatch(/^text\/csv/);
      expect(res.headers['content-disposition']).toMatch(/^attachment;/);
      const parsed = Papa.parse<string[]>(res.text.replace(/^\uFEFF/, ''), { skipEmptyLines: true });
      expect(parsed.errors, path).toEqual([]);
      for (const cell of parsed.data.flat()) {
        if (PLAIN_NUMBER.test(cell)) continue;
        expect(cell, `${path} cell ${JSON.stringify(cell)}`).not.toMatch(FORMULA_START);
        if (/^'[=+\-@\t\r]/.test(cell)) neutralised.push(cell);
      }
    }
    // The exports really did carry the hostile names, each trigger escaped rather than dropped.
    for (const trigger of TRIGGERS) expect(neutralised.some((c) => c.startsWith(`'${trigger}`)), `a cell starting with ${JSON.stringify(trigger)}`).toBe(true);
  });
});
