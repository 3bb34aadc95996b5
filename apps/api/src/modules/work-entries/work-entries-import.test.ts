import { and, count, eq } from 'drizzle-orm';
import { costEntries, meterReadings, workEntries } from '@hitchbook/db';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createOperation, signInAll, type OperationFixture } from '../../test-support/fixtures.js';
import { createTestApp, type TestApp } from '../../test-support/test-app.js';
import { addMeterReading, createFleet } from './test-helpers.js';

let t: TestApp;
const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });

beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

async function outfit() {
  const fx = await createOperation(t.dbh.db);
  const fleet = await createFleet(t.dbh.db, fx);
  const tokens = await signInAll(t, fx);
  const [householdA] = await t.dbh.db.query.parties.findMany({ where: (p, { eq: is }) => is(p.id, fx.households[0]) });
  const [customerC] = await t.dbh.db.query.parties.findMany({ where: (p, { eq: is }) => is(p.id, fx.customers[0]) });
  return { fx, fleet, tokens, householdA: householdA!.name, customerC: customerC!.name };
}

function upload(token: string, kind: 'entries' | 'fuel', mode: 'preview' | 'commit', csv: string | Buffer, name = 'entries.csv') {
  return t
    .http()
    .post(`/api/work-entries/import?kind=${kind}&mode=${mode}`)
    .set(bearer(token))
    .attach('file', Buffer.isBuffer(csv) ? csv : Buffer.from(csv, 'utf8'), { filename: name, contentType: 'text/csv' });
}

async function entriesOf(operationId: string): Promise<number> {
  const [row] = await t.dbh.db.select({ n: count() }).from(workEntries).where(eq(workEntries.operationId, operationId));
  return row!.n;
}

const HEADER = 'Date,Field,Work Type,Power Unit,Implement,Operator E-mail,Hours,Meter Start,Meter End,Acres,Miles,Fuel Gallons,Bill To,Notes';

function entryCsv(fx: OperationFixture, householdA: string, customerC: string): string {
  const op = fx.members.operator.email;
  return [
    HEADER,
    `2025-05-01,home 40,Mowing (rotary),Red 7120,Batwing 15,${op},4.5,,,,,12.5,${householdA},first pass`,
    `5/2/2025,Creek 80,disking,T-3,Tandem 21,${op.toUpperCase()},,1200.0,1206.5,,,,${customerC},"north end, by the creek"`,
    `2025-05-03,Township Rd 12,Roadside mowing,Red 7120,Batwing 15,${op},2,,,,,,${customerC},`,
  ].join('\r\n');
}

describe('work-entry import', () => {
  it('previews every row without writing: names matched in any letter case, defaults filled in', async () => {
    const { fx, tokens, householdA, customerC } = await outfit();
    const res = await upload(tokens.owner, 'entries', 'preview', entryCsv(fx, householdA, customerC));
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ kind: 'entries', mode: 'preview', total: 3, valid: 3, invalid: 0, skipped: 0, created: 0, errors: [] });
    expect(res.body.rows.map((r: { row: number; field: string; hours: string; acres: string; miles: string | null }) => [r.row, r.field, r.hours, r.acres, r.miles])).toEqual([
      [2, 'Home 40', '4.50', '40.000', null],
      [3, 'Creek 80', '6.50', '78.500', null],
      [4, 'Township Rd 12', '2.00', '2.000', '2.000'],
    ]);
    expect(await entriesOf(fx.operationId)).toBe(0);
  });

  it('names every bad cell by row and column in the preview', async () => {
    const { fx, tokens, householdA } = await outfit();
    const op = fx.members.operator.email;
    const csv = [
      HEADER,
      `2025-05-01,Home 40,Mowing (rotary),Red 7120,Batwing 15,${op},4.5,,,,,,${householdA},`,
      `2025-02-30,Back 40,Mowing (rotary),Batwing 15,Red 7120,nobody@example.test,25,,,,,,Someone Else,`,
      `2025-05-02,Home 40,Mowing (rotary),,,${op},,,1210.0,,,,${householdA},`,
      `2025-05-02,Home 40,Mowing (rotary),,,${op},1.234,,,-3,,,${householdA},`,
    ].join('\n');
    const res = await upload(tokens.partner, 'entries', 'preview', csv);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ total: 4, valid: 1, invalid: 3 });
    expect(res.body.errors.map((e: { row: number; column: string }) => `${e.row} ${e.column}`)).toEqual([
      '3 date',
      '3 field',
      '3 power unit',
      '3 implement',
      '3 operator email',
      '3 hours',
      '3 bill to',
      '4 meter start',
      '5 hours',
      '5 acres',
    ]);
    expect(res.body.errors.find((e: { column: string }) => e.column === 'field').reason).toBe('No field called "Back 40" in this operation.');
    expect(res.body.rows.map((r: { row: number }) => r.row)).toEqual([2]);
  });

  it('commits all or nothing: one bad row writes nothing and answers 400 with the same errors', async () => {
    const { fx, tokens, householdA, customerC } = await outfit();
    const bad = `${entryCsv(fx, householdA, customerC)}\r\n2025-05-04,Home 40,Mowing (rotary),,,${fx.members.operator.email},3,,,,,,Nobody Farms,`;
    const preview = await upload(tokens.owner, 'entries', 'preview', bad);
    const commit = await upload(tokens.owner, 'entries', 'commit', bad);
    expect(commit.status).toBe(400);
    expect(commit.body.message).toBe('Nothing was imported: 1 row needs attention.');
    expect(commit.body.errors).toEqual(preview.body.errors);
    expect(commit.body.errors).toEqual([{ row: 5, column: 'bill to', reason: 'No household or customer called "Nobody Farms" in this operation.' }]);
    expect(commit.body.issues).toEqual([{ path: 'row 5, bill to', message: commit.body.errors[0].reason }]);
    expect(commit.body.created).toBe(0);
    expect(await entriesOf(fx.operationId)).toBe(0);
    const readings = await t.dbh.db.select().from(meterReadings).where(eq(meterReadings.operationId, fx.operationId));
    expect(readings).toEqual([]);
  });

  it('commits a clean file as submitted entries with their meter readings, and a re-upload creates nothing', async () => {
    const { fx, fleet, tokens, householdA, customerC } = await outfit();
    const csv = entryCsv(fx, householdA, customerC);
    const first = await upload(tokens.owner, 'entries', 'commit', csv);
    expect(first.status).toBe(200);
    expect(first.body).toMatchObject({ mode: 'commit', total: 3, valid: 3, created: 3, skipped: 0 });
    const stored = await t.dbh.db.select().from(workEntries).where(eq(workEntries.operationId, fx.operationId)).orderBy(workEntries.workDate);
    expect(stored.map((e) => [e.workDate, e.state, e.hours, e.notes])).toEqual([
      ['2025-05-01', 'submitted', '4.50', 'first pass'],
      ['2025-05-02', 'submitted', '6.50', 'north end, by the creek'],
      ['2025-05-03', 'submitted', '2.00', null],
    ]);
    const readings = await t.dbh.db.select().from(meterReadings).where(eq(meterReadings.machineId, fleet.tractor));
    expect(readings.map((r) => [r.hours, r.source, r.workEntryId])).toEqual([['1206.5', 'import', stored[1]!.id]]);

    // The same rows again, one of them retyped with other spacing, case and number format.
    const again = csv.replace('home 40,Mowing (rotary)', 'HOME  40,mowing (ROTARY)').replace(',4.5,', ',4.50,');
    const second = await upload(tokens.owner, 'entries', 'commit', again);
    expect(second.status).toBe(200);
    expect(second.body).toMatchObject({ total: 3, created: 0, skipped: 3 });
    expect(second.body.skippedRows.map((s: { row: number }) => s.row)).toEqual([2, 3, 4]);
    expect(await entriesOf(fx.operationId)).toBe(3);
  });

  it('stores a row repeated within one file once', async () => {
    const { fx, tokens, householdA } = await outfit();
    const row = `2025-05-01,Home 40,Mowing (rotary),,,${fx.members.operator.email},2,,,,,,${householdA},`;
    const res = await upload(tokens.owner, 'entries', 'commit', [HEADER, row, row].join('\n'));
    expect(res.body).toMatchObject({ created: 1, skipped: 1, skippedRows: [{ row: 3, reason: 'Same as row 2 of this file; stored once.' }] });
  });

  it('stores every cell as the file gives it, quotes, braces, backslashes and empty cells included', async () => {
    const { fx, fleet, tokens, householdA, customerC } = await outfit();
    const op = fx.members.operator.email;
    // Characters that mean something inside a PostgreSQL array literal, where a batch's columns travel.
    const awkward = 'gate "B" {north}, \\ left open; naïve NULL';
    const csv = [
      HEADER,
      `2025-05-01,Home 40,Mowing (rotary),Red 7120,Batwing 15,${op},4.5,,,,,12.5,${householdA},"${awkward.replaceAll('"', '""')}"`,
      `2025-05-02,Creek 80,disking,T-3,,${op},,1200.0,1206.5,33.25,,,${customerC},NULL`,
    ].join('\n');
    const res = await upload(tokens.owner, 'entries', 'commit', csv);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.created).toBe(2);
    const stored = await t.dbh.db.select().from(workEntries).where(eq(workEntries.operationId, fx.operationId)).orderBy(workEntries.workDate);
    expect(stored.map((e) => [e.notes, e.hours, e.acres, e.meterStart, e.meterEnd, e.fuelGallons, e.implementMachineId === null, e.powerMachineId, e.state, e.submittedAt !== null, e.importKey?.length])).toEqual([
      [awkward, '4.50', '40.000', null, null, '12.500', false, fleet.tractor, 'submitted', true, 64],
      ['NULL', '6.50', '33.250', '1200.0', '1206.5', null, true, fleet.tractor, 'submitted', true, 64],
    ]);
  });

  it('keeps the meter order against stored readings and between the rows of the file', async () => {
    const { fx, fleet, tokens, householdA } = await outfit();
    await addMeterReading(t.dbh.db, fx.operationId, fleet.tractor, '2025-05-05T18:00:00Z', '1300.0');
    const op = fx.members.operator.email;
    const csv = [
      HEADER,
      `2025-05-01,Home 40,Mowing (rotary),Red 7120,,${op},,1280.0,1284.0,,,,${householdA},`,
      `2025-05-02,Home 40,Mowing (rotary),Red 7120,,${op},,1276.0,1279.0,,,,${householdA},`,
      `2025-05-06,Home 40,Mowing (rotary),Red 7120,,${op},,1290.0,1295.0,,,,${householdA},`,
    ].join('\n');
    const res = await upload(tokens.owner, 'entries', 'preview', csv);
    expect(res.body.errors.map((e: { row: number; column: string }) => `${e.row} ${e.column}`)).toEqual(['3 meter end', '4 meter end']);
    expect(res.body.errors[0].reason).toContain('below the meter end 1284.0 of row 2 on 2025-05-01');
    expect(res.body.errors[1].reason).toContain("below the machine's reading of 1300.0 on 2025-05-05");
  });

  it('refuses a file that is not the template, not UTF-8, empty or not a .csv, naming the file', async () => {
    const { tokens } = await outfit();
    const unknown = await upload(tokens.owner, 'entries', 'preview', 'date,field,colour\n2025-05-01,Home 40,red\n');
    expect(unknown.status).toBe(400);
    expect(unknown.body.issues.map((i: { message: string }) => i.message)).toEqual(
      expect.arrayContaining(['Unknown column "colour".', 'The required column "work type" is missing.', 'The required column "bill to" is missing.']),
    );
    const latin1 = await upload(tokens.owner, 'entries', 'preview', Buffer.from(`${HEADER}\n2025-05-01,K\xf6hler,x\n`, 'latin1'));
    expect(latin1.status).toBe(400);
    expect(latin1.body.issues[0]).toMatchObject({ path: 'file', message: expect.stringContaining('not UTF-8') });
    expect((await upload(tokens.owner, 'entries', 'preview', `${HEADER}\n`)).status).toBe(400);
    const exe = await upload(tokens.owner, 'entries', 'preview', `${HEADER}\n`, 'entries.exe');
    expect(exe.status).toBe(400);
    expect(exe.body.issues[0].path).toBe('file');
    const none = await t.http().post('/api/work-entries/import?kind=entries').set(bearer(tokens.owner)).send({});
    expect(none.status).toBe(400);
    expect(none.body.issues[0].path).toBe('file');
  });

  it('refuses a file over 10 MB with 413 before reading it', async () => {
    const { fx, tokens } = await outfit();
    const res = await upload(tokens.owner, 'entries', 'commit', Buffer.alloc(10 * 1024 * 1024 + 70 * 1024, 'a'));
    expect(res.status).toBe(413);
    expect(res.body.issues[0].path).toBe('file');
    expect(await entriesOf(fx.operationId)).toBe(0);
  });

  it('is for owners and partners only', async () => {
    const { fx, tokens, householdA, customerC } = await outfit();
    for (const role of ['operator', 'bookkeeper', 'customer'] as const) {
      expect((await upload(tokens[role], 'entries', 'commit', entryCsv(fx, householdA, customerC))).status).toBe(403);
    }
    expect(await entriesOf(fx.operationId)).toBe(0);
  });

  it('matches names only within the operation', async () => {
    const mine = await outfit();
    const theirs = await outfit();
    const res = await upload(mine.tokens.owner, 'entries', 'preview', entryCsv(mine.fx, theirs.householdA, theirs.customerC));
    expect(res.body.errors.map((e: { column: string }) => e.column)).toEqual(['bill to', 'bill to', 'bill to']);
    const foreignOperator = await upload(mine.tokens.owner, 'entries', 'preview', entryCsv(theirs.fx, mine.householdA, mine.customerC));
    expect(foreignOperator.body.errors.map((e: { column: string }) => e.column)).toEqual(['operator email', 'operator email', 'operator email']);
  });

  it('imports 10,000 rows in one commit', async () => {
    const { fx, tokens, householdA } = await outfit();
    const op = fx.members.operator.email;
    const lines = [HEADER];
    for (let i = 0; i < 10_000; i++) {
      const day = new Date(Date.UTC(2020, 0, 1) + Math.floor(i / 8) * 86_400_000).toISOString().slice(0, 10);
      lines.push(`${day},Home 40,Mowing (rotary),,,${op},1.${String(i % 100).padStart(2, '0')},,,,,,${householdA},pass ${i}`);
    }
    const res = await upload(tokens.owner, 'entries', 'commit', lines.join('\n'));
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ total: 10_000, valid: 10_000, created: 10_000, skipped: 0 });
    expect(await entriesOf(fx.operationId)).toBe(10_000);
    // Room for a loaded machine: this checks that a large file works, not how fast (see npm run bench).
  }, 180_000);
});

describe('fuel-ticket import', () => {
  const FUEL_HEADER = 'date,machine,gallons,amount,vendor,paid by,meter hours,notes';

  it('turns each ticket into a fuel cost entry with its gallons, once', async () => {
    const { fx, fleet, tokens, householdA } = await outfit();
    const csv = [FUEL_HEADER, `2025-05-01,Red 7120,48.5,"$1,212.50",Fenwold Co-op,${householdA},1201.3,dyed diesel`, '5/9/2025,swather 9,20,61.40,,,,'].join('\n');
    const first = await upload(tokens.partner, 'fuel', 'commit', csv, 'tickets.csv');
    expect(first.status).toBe(200);
    expect(first.body).toMatchObject({ kind: 'fuel', total: 2, created: 2 });
    const rows = await t.dbh.db.select().from(costEntries).where(eq(costEntries.operationId, fx.operationId)).orderBy(costEntries.incurredOn);
    expect(rows.map((r) => [r.machineId, r.category, r.incurredOn, r.gallons, r.amount, r.vendor, r.paidByPartyId, r.meterHours, r.notes, r.createdBy, r.importKey?.length])).toEqual([
      [fleet.tractor, 'fuel', '2025-05-01', '48.500', '1212.50', 'Fenwold Co-op', fx.households[0], '1201.3', 'dyed diesel', fx.members.partner.userId, 64],
      [fleet.windrower, 'fuel', '2025-05-09', '20.000', '61.40', null, null, null, null, fx.members.partner.userId, 64],
    ]);
    const again = await upload(tokens.partner, 'fuel', 'commit', csv, 'tickets.csv');
    expect(again.body).toMatchObject({ created: 0, skipped: 2 });
    const [n] = await t.dbh.db.select({ n: count() }).from(costEntries).where(and(eq(costEntries.operationId, fx.operationId), eq(costEntries.category, 'fuel')));
    expect(n!.n).toBe(2);
  });

  it('names bad tickets: an implement, no gallons, half cents, a customer as payer', async () => {
    const { tokens, customerC } = await outfit();
    const csv = [FUEL_HEADER, `2025-05-01,Batwing 15,0,12.345,,${customerC},,`].join('\n');
    const res = await upload(tokens.owner, 'fuel', 'commit', csv, 'tickets.csv');
    expect(res.status).toBe(400);
    expect(res.body.errors.map((e: { column: string }) => e.column)).toEqual(['machine', 'gallons', 'amount', 'paid by']);
  });
});
