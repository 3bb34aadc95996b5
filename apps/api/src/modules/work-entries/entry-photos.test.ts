import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { and, count, eq } from 'drizzle-orm';
import { auditLog, uploads, workEntryPhotos } from '@hitchbook/db';
import { MAX_ENTRY_PHOTOS } from '@hitchbook/shared/schemas/work-entries';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createOperation, signInAll, type OperationFixture } from '../../test-support/fixtures.js';
import { createTestApp, type TestApp } from '../../test-support/test-app.js';
import { billEntry, createFleet, type FleetFixture } from './test-helpers.js';

let t: TestApp;
const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });
/** A 1×1 PNG (signature, IHDR, IDAT, IEND). */
const PNG = Buffer.from('89504e470d0a1a0a0000000d4948445200000001000000010802000000907753de0000000c4944415408d763f8ffff3f0005fe02fea7d6a4c90000000049454e44ae426082', 'hex');
/** The start of a JFIF file: SOI and the APP0 marker are what identify a JPEG. */
const JPEG = Buffer.concat([Buffer.from('ffd8ffe000104a46494600010100000100010000', 'hex'), Buffer.alloc(64, 0), Buffer.from('ffd9', 'hex')]);
const PDF = Buffer.from('%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n');

beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

async function outfit() {
  const fx = await createOperation(t.dbh.db);
  const fleet = await createFleet(t.dbh.db, fx);
  const tokens = await signInAll(t, fx);
  return { fx, fleet, tokens };
}

type Outfit = Awaited<ReturnType<typeof outfit>>;

async function logEntry({ fx, fleet, tokens }: Outfit, token = tokens.operator, overrides: Record<string, unknown> = {}): Promise<string> {
  const res = await t
    .http()
    .post('/api/work-entries')
    .set(bearer(token))
    .send({ workDate: '2025-06-03', fieldId: fleet.home40, workTypeId: fleet.mowing, billToPartyId: fx.households[0], hours: '3', state: 'submitted', ...overrides });
  expect(res.status).toBe(201);
  return res.body.id as string;
}

const attach = (entryId: string, token: string, data: Buffer, name: string) =>
  t.http().post(`/api/work-entries/${entryId}/photos`).set(bearer(token)).attach('file', data, { filename: name, contentType: 'application/octet-stream' });
const photosOf = (entryId: string, token: string) => t.http().get(`/api/work-entries/${entryId}/photos`).set(bearer(token));

async function linkCount(entryId: string): Promise<number> {
  const [row] = await t.dbh.db.select({ n: count() }).from(workEntryPhotos).where(eq(workEntryPhotos.workEntryId, entryId));
  return row!.n;
}

describe('work-entry photos', () => {
  it('attaches a PNG and a JPEG from the cab, lists them in order and gives back the same bytes', async () => {
    const o = await outfit();
    const entryId = await logEntry(o);
    const png = await attach(entryId, o.tokens.operator, PNG, 'north-corner.png');
    expect(png.status).toBe(201);
    expect(png.body).toMatchObject({ originalName: 'north-corner.png', contentType: 'image/png', sizeBytes: PNG.length });
    const jpeg = await attach(entryId, o.tokens.operator, JPEG, 'IMG_0412.JPG');
    expect(jpeg.status).toBe(201);
    expect(jpeg.body.contentType).toBe('image/jpeg');

    const list = await photosOf(entryId, o.tokens.partner);
    expect(list.status).toBe(200);
    expect(list.body.map((p: { uploadId: string }) => p.uploadId)).toEqual([png.body.uploadId, jpeg.body.uploadId]);

    const file = await t.http().get(`/api/work-entries/${entryId}/photos/${png.body.uploadId}`).set(bearer(o.tokens.operator)).buffer(true).parse((res, done) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => done(null, Buffer.concat(chunks)));
    });
    expect(file.status).toBe(200);
    expect(file.headers['content-type']).toBe('image/png');
    expect(Buffer.compare(file.body as Buffer, PNG)).toBe(0);

    const [audited] = await t.dbh.db.select({ n: count() }).from(auditLog).where(and(eq(auditLog.entityId, entryId), eq(auditLog.action, 'work-entry.photo-added')));
    expect(audited!.n).toBe(2);
  });

  it('checks the content, not the name: a PDF named .jpg, an empty file and no file are refused and nothing is linked', async () => {
    const o = await outfit();
    const entryId = await logEntry(o);
    const pdf = await attach(entryId, o.tokens.operator, PDF, 'photo.jpg');
    expect(pdf.status).toBe(400);
    expect(pdf.body.issues[0]).toMatchObject({ path: 'file', message: expect.stringContaining('application/pdf') });
    const renamed = await attach(entryId, o.tokens.operator, PNG, 'photo.jpg');
    expect(renamed.status).toBe(400);
    expect(renamed.body.issues[0].message).toContain('.png');
    expect((await attach(entryId, o.tokens.operator, Buffer.alloc(0), 'empty.png')).status).toBe(400);
    const none = await t.http().post(`/api/work-entries/${entryId}/photos`).set(bearer(o.tokens.operator)).field('note', 'x');
    expect(none.status).toBe(400);
    expect(await linkCount(entryId)).toBe(0);
    const [stored] = await t.dbh.db.select({ n: count() }).from(uploads).where(eq(uploads.operationId, o.fx.operationId));
    expect(stored!.n).toBe(0);
  });

  it('refuses a photo over 10 MB with 413 and stores nothing', async () => {
    const o = await outfit();
    const entryId = await logEntry(o);
    const big = Buffer.concat([PNG, Buffer.alloc(10 * 1024 * 1024 + 1, 0)]);
    const res = await attach(entryId, o.tokens.operator, big, 'huge.png').catch((err: { response?: { status: number } }) => err.response ?? { status: 0 });
    expect(res.status).toBe(413);
    expect(await linkCount(entryId)).toBe(0);
  });

  it(`holds at most ${MAX_ENTRY_PHOTOS} photos per entry`, async () => {
    const o = await outfit();
    const entryId = await logEntry(o);
    for (let i = 0; i < MAX_ENTRY_PHOTOS; i++) expect((await attach(entryId, o.tokens.operator, PNG, `p${i}.png`)).status).toBe(201);
    const extra = await attach(entryId, o.tokens.operator, PNG, 'one-more.png');
    expect(extra.status).toBe(409);
    expect(extra.body.message).toContain(`at most ${MAX_ENTRY_PHOTOS}`);
    expect(await linkCount(entryId)).toBe(MAX_ENTRY_PHOTOS);
  });

  it("keeps an operator to their own entries' photos and customers out entirely", async () => {
    const o = await outfit();
    const partnersEntry = await logEntry(o, o.tokens.partner);
    const photo = await attach(partnersEntry, o.tokens.partner, PNG, 'p.png');
    expect(photo.status).toBe(201);
    const one = `/api/work-entries/${partnersEntry}/photos/${photo.body.uploadId}`;
    expect((await photosOf(partnersEntry, o.tokens.operator)).status).toBe(404);
    expect((await t.http().get(one).set(bearer(o.tokens.operator))).status).toBe(404);
    expect((await attach(partnersEntry, o.tokens.operator, PNG, 'mine.png')).status).toBe(404);
    expect((await t.http().delete(one).set(bearer(o.tokens.operator))).status).toBe(404);
    // Nor by the upload's id alone: entry photos are reached only through their entry.
    expect((await t.http().get(`/api/uploads/${photo.body.uploadId}`).set(bearer(o.tokens.operator))).status).toBe(404);

    expect((await photosOf(partnersEntry, o.tokens.customer)).status).toBe(403);
    expect((await t.http().get(one).set(bearer(o.tokens.customer))).status).toBe(403);
    expect((await attach(partnersEntry, o.tokens.customer, PNG, 'c.png')).status).toBe(403);

    expect((await photosOf(partnersEntry, o.tokens.owner)).body).toHaveLength(1);
    expect((await t.http().get(one).set(bearer(o.tokens.bookkeeper))).status).toBe(200);
    expect((await attach(partnersEntry, o.tokens.bookkeeper, PNG, 'b.png')).status).toBe(403);
    expect(await linkCount(partnersEntry)).toBe(1);
  });

  it("answers 404 for another operation's entry and photo ids and changes nothing", async () => {
    const mine = await outfit();
    const theirs = await outfit();
    const theirEntry = await logEntry(theirs);
    const theirPhoto = await attach(theirEntry, theirs.tokens.operator, PNG, 't.png');
    const myEntry = await logEntry(mine);
    const myPhoto = await attach(myEntry, mine.tokens.operator, PNG, 'm.png');

    expect((await photosOf(theirEntry, mine.tokens.owner)).status).toBe(404);
    expect((await attach(theirEntry, mine.tokens.owner, PNG, 'x.png')).status).toBe(404);
    expect((await t.http().get(`/api/work-entries/${theirEntry}/photos/${theirPhoto.body.uploadId}`).set(bearer(mine.tokens.owner))).status).toBe(404);
    expect((await t.http().delete(`/api/work-entries/${theirEntry}/photos/${theirPhoto.body.uploadId}`).set(bearer(mine.tokens.owner))).status).toBe(404);
    // Their photo under my entry's id is no photo of mine either.
    expect((await t.http().get(`/api/work-entries/${myEntry}/photos/${theirPhoto.body.uploadId}`).set(bearer(mine.tokens.owner))).status).toBe(404);
    expect((await t.http().delete(`/api/work-entries/${myEntry}/photos/${theirPhoto.body.uploadId}`).set(bearer(mine.tokens.owner))).status).toBe(404);
    expect(await linkCount(theirEntry)).toBe(1);
    expect(await linkCount(myEntry)).toBe(1);
    expect(myPhoto.status).toBe(201);
  });

  it('changes photos only while the entry may change: not once approved until reopened, never once invoiced', async () => {
    const o = await outfit();
    const entryId = await logEntry(o);
    const first = await attach(entryId, o.tokens.operator, PNG, 'before.png');
    expect((await t.http().post(`/api/work-entries/${entryId}/approve`).set(bearer(o.tokens.partner)).send({})).status).toBe(200);

    const approved = await attach(entryId, o.tokens.operator, PNG, 'after.png');
    expect(approved.status).toBe(409);
    expect(approved.body.message).toContain('reopen');
    expect((await t.http().delete(`/api/work-entries/${entryId}/photos/${first.body.uploadId}`).set(bearer(o.tokens.partner))).status).toBe(409);
    expect((await photosOf(entryId, o.tokens.operator)).body).toHaveLength(1);

    expect((await t.http().post(`/api/work-entries/${entryId}/reopen`).set(bearer(o.tokens.partner)).send({})).status).toBe(200);
    expect((await attach(entryId, o.tokens.operator, PNG, 'after.png')).status).toBe(201);

    const invoiced = await logEntry(o, o.tokens.partner, { billToPartyId: o.fx.customers[0] });
    const kept = await attach(invoiced, o.tokens.partner, PNG, 'kept.png');
    await billEntry(t.dbh.db, o.fx.operationId, o.fx.customers[0], invoiced);
    expect((await attach(invoiced, o.tokens.owner, PNG, 'late.png')).status).toBe(409);
    const del = await t.http().delete(`/api/work-entries/${invoiced}/photos/${kept.body.uploadId}`).set(bearer(o.tokens.owner));
    expect(del.status).toBe(409);
    expect(del.body.message).toContain('invoice');
    expect(await linkCount(invoiced)).toBe(1);
  });

  it('removes a photo with its stored file, and a deleted draft takes its photos along', async () => {
    const o = await outfit();
    const entryId = await logEntry(o, o.tokens.operator, { state: 'draft' });
    const a = await attach(entryId, o.tokens.operator, PNG, 'a.png');
    const b = await attach(entryId, o.tokens.operator, JPEG, 'b.jpg');
    const keyOf = async (id: string) => (await t.dbh.db.select({ key: uploads.storageKey }).from(uploads).where(eq(uploads.id, id)))[0]?.key;
    const [keyA, keyB] = [await keyOf(a.body.uploadId), await keyOf(b.body.uploadId)];
    // Stored the way LocalDiskStorage lays files out: a folder per key's first two characters.
    const fileOf = (key: string | undefined) => join(t.config.uploadDir, key!.slice(0, 2), key!);
    expect(existsSync(fileOf(keyA)) && existsSync(fileOf(keyB))).toBe(true);

    expect((await t.http().delete(`/api/work-entries/${entryId}/photos/${a.body.uploadId}`).set(bearer(o.tokens.operator))).status).toBe(204);
    expect((await photosOf(entryId, o.tokens.operator)).body.map((p: { uploadId: string }) => p.uploadId)).toEqual([b.body.uploadId]);
    expect(await keyOf(a.body.uploadId)).toBeUndefined();
    expect(existsSync(fileOf(keyA))).toBe(false);

    expect((await t.http().delete(`/api/work-entries/${entryId}`).set(bearer(o.tokens.operator))).status).toBe(204);
    expect(await keyOf(b.body.uploadId)).toBeUndefined();
    expect(existsSync(fileOf(keyB))).toBe(false);
  });
});
