import { createHash } from 'node:crypto';
import { existsSync, readFileSync } from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { resolve } from 'node:path';
import { deflateSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MAX_UPLOAD_BYTES } from '@hitchbook/shared/schemas/machines';
import { createOperation, signInAll, type OperationFixture } from '../../test-support/fixtures.js';
import { createTestApp, type TestApp } from '../../test-support/test-app.js';
import { isInside, LocalDiskStorage } from './local-disk-storage.js';

let t: TestApp;
let fx: OperationFixture;
let other: OperationFixture;
let tokens: Awaited<ReturnType<typeof signInAll>>;
let otherTokens: Awaited<ReturnType<typeof signInAll>>;
const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });

/** A real 1×1 PNG: signature, IHDR, one IDAT row, IEND (PNG spec, W3C 2003). */
function pngBytes(): Buffer {
  const crcTable = Array.from({ length: 256 }, (_, n) => {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    return c >>> 0;
  });
  const crc = (buf: Buffer) => {
    let c = 0xffffffff;
    for (const byte of buf) c = crcTable[(c ^ byte) & 0xff]! ^ (c >>> 8);
    return (c ^ 0xffffffff) >>> 0;
  };
  const chunk = (type: string, data: Buffer) => {
    const body = Buffer.concat([Buffer.from(type, 'ascii'), data]);
    const out = Buffer.alloc(8 + data.length + 4);
    out.writeUInt32BE(data.length, 0);
    body.copy(out, 4);
    out.writeUInt32BE(crc(body), 8 + data.length);
    return out;
  };
  const ihdr = Buffer.from([0, 0, 0, 1, 0, 0, 0, 1, 8, 2, 0, 0, 0]);
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', ihdr),
    chunk('IDAT', deflateSync(Buffer.from([0, 255, 255, 255]))),
    chunk('IEND', Buffer.alloc(0)),
  ]);
}

const PDF = Buffer.from('%PDF-1.4\n1 0 obj << /Type /Catalog /Pages 2 0 R >> endobj\n2 0 obj << /Type /Pages /Kids [] /Count 0 >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n');
const SQUARE = { type: 'Polygon', coordinates: [[[12, 42], [12.01, 42], [12.01, 42.01], [12, 42.01], [12, 42]]] };

function upload(token: string, purpose: string, data: Buffer, name: string, contentType = 'application/octet-stream') {
  return t.http().post('/api/uploads').set(bearer(token)).field('purpose', purpose).attach('file', data, { filename: name, contentType });
}

/** Sends only the head of a request and reports the status the server answers with. */
function statusForHead(headers: Record<string, string | number>, head: string, moreBytes: number): Promise<number> {
  const { port } = (t.app.getHttpServer() as http.Server).address() as AddressInfo;
  return new Promise((resolveStatus, reject) => {
    const req = http.request({ host: '127.0.0.1', port, method: 'POST', path: '/api/uploads', headers });
    req.on('response', (res) => {
      res.resume();
      resolveStatus(res.statusCode ?? 0);
      req.destroy();
    });
    req.on('error', (err) => (err.message.includes('socket hang up') ? undefined : reject(err)));
    req.write(head);
    // Feed the rest slowly; a server that waits for the whole body before answering fails the test by timeout.
    let sent = 0;
    const chunk = Buffer.alloc(256 * 1024, 0x41);
    const pump = () => {
      if (req.destroyed || sent >= moreBytes) return;
      sent += chunk.length;
      req.write(chunk, () => setImmediate(pump));
    };
    if (moreBytes > 0) pump();
  });
}

beforeAll(async () => {
  t = await createTestApp();
  await t.app.listen(0, '127.0.0.1');
  fx = await createOperation(t.dbh.db);
  other = await createOperation(t.dbh.db, 'Elsewhere');
  tokens = await signInAll(t, fx);
  otherTokens = await signInAll(t, other);
});
afterAll(() => t.close());

describe('uploads', () => {
  it('stores a real PNG receipt under a random name outside any served folder, with its SHA-256', async () => {
    const png = pngBytes();
    const res = await upload(tokens.partner, 'receipt', png, 'fuel ticket.png', 'image/png');
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ purpose: 'receipt', originalName: 'fuel ticket.png', contentType: 'image/png', sizeBytes: png.length });
    expect(res.body.sha256).toBe(createHash('sha256').update(png).digest('hex'));

    const row = await t.dbh.db.query.uploads.findFirst({ where: (u, { eq }) => eq(u.id, res.body.id) });
    expect(row!.storageKey).toMatch(/^[0-9a-f]{64}$/);
    const stored = new LocalDiskStorage(t.config.uploadDir, []).pathFor(row!.storageKey);
    expect(readFileSync(stored).equals(png)).toBe(true);
    const webRoot = resolve(import.meta.dirname, '../../../../web');
    for (const served of [resolve(webRoot, 'dist'), resolve(webRoot, 'public'), ...(t.config.webDist ? [t.config.webDist] : [])]) {
      expect(isInside(stored, served), served).toBe(false);
    }
    expect((await t.http().get(`/${row!.storageKey}`)).status).toBe(404);
  });

  it('serves a receipt back to money roles as an attachment that browsers must not sniff', async () => {
    const created = await upload(tokens.owner, 'receipt', PDF, 'invoice.pdf', 'application/pdf');
    expect(created.status).toBe(201);
    expect(created.body.contentType).toBe('application/pdf');
    for (const role of ['owner', 'partner', 'bookkeeper'] as const) {
      const res = await t.http().get(`/api/uploads/${created.body.id}`).set(bearer(tokens[role])).buffer(true).parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      });
      expect(res.status, role).toBe(200);
      expect((res.body as Buffer).equals(PDF)).toBe(true);
      expect(res.headers['content-type']).toMatch(/^application\/pdf/);
      expect(res.headers['content-disposition']).toBe(`attachment; filename="invoice.pdf"; filename*=UTF-8''invoice.pdf`);
      expect(res.headers['x-content-type-options']).toBe('nosniff');
      expect(res.headers['cache-control']).toBe('no-store');
    }
  });

  it('refuses a text file named .png and HTML named .pdf, whatever type the client claims', async () => {
    const text = await upload(tokens.owner, 'receipt', Buffer.from('just some notes\n'), 'photo.png', 'image/png');
    expect(text.status).toBe(400);
    expect(text.body.issues[0].path).toBe('file');
    const html = await upload(tokens.owner, 'receipt', Buffer.from('<html><script>alert(1)</script></html>'), 'x.pdf', 'application/pdf');
    expect(html.status).toBe(400);
    expect(html.body.issues[0].path).toBe('file');
  });

  it('refuses a real PNG whose name claims another type, and a PDF offered as a machine photo', async () => {
    const renamed = await upload(tokens.owner, 'receipt', pngBytes(), 'receipt.pdf');
    expect(renamed.status).toBe(400);
    expect(renamed.body.issues[0].message).toMatch(/named \.pdf but its content is a PNG image/);
    const photo = await upload(tokens.owner, 'machine-photo', PDF, 'tractor.pdf');
    expect(photo.status).toBe(400);
  });

  it('keeps only the last segment of a file name, without control characters', async () => {
    const res = await upload(tokens.owner, 'machine-photo', pngBytes(), '../../etc/cab\r\nphoto.png');
    expect(res.status).toBe(201);
    expect(res.body.originalName).toBe('cabphoto.png');
  });

  it('answers 413 to a declared 11 MB upload before reading its body', async () => {
    const size = 11 * 1024 * 1024;
    const status = await statusForHead(
      { Authorization: `Bearer ${tokens.owner}`, 'Content-Type': 'multipart/form-data; boundary=xyz', 'Content-Length': size },
      '--xyz\r\nContent-Disposition: form-data; name="purpose"\r\n\r\nreceipt\r\n',
      0,
    );
    expect(status).toBe(413);
  });

  it('cuts off an 11 MB upload sent without a length at the 10 MB limit with 413, storing nothing', async () => {
    const before = await t.dbh.db.query.uploads.findMany({ where: (u, { eq }) => eq(u.operationId, fx.operationId) });
    const status = await statusForHead(
      { Authorization: `Bearer ${tokens.owner}`, 'Content-Type': 'multipart/form-data; boundary=xyz', 'Transfer-Encoding': 'chunked' },
      '--xyz\r\nContent-Disposition: form-data; name="purpose"\r\n\r\nreceipt\r\n--xyz\r\nContent-Disposition: form-data; name="file"; filename="big.png"\r\nContent-Type: image/png\r\n\r\n',
      MAX_UPLOAD_BYTES + 1024 * 1024,
    );
    expect(status).toBe(413);
    const after = await t.dbh.db.query.uploads.findMany({ where: (u, { eq }) => eq(u.operationId, fx.operationId) });
    expect(after.length).toBe(before.length);
  });

  it('accepts a GeoJSON boundary and refuses one that is not a polygon', async () => {
    const ok = await upload(tokens.partner, 'field-boundary', Buffer.from(JSON.stringify({ type: 'Feature', properties: {}, geometry: SQUARE })), 'north.geojson');
    expect(ok.status).toBe(201);
    expect(ok.body.contentType).toBe('application/geo+json');
    const point = await upload(tokens.partner, 'field-boundary', Buffer.from(JSON.stringify({ type: 'Point', coordinates: [12, 42] })), 'pin.geojson');
    expect(point.status).toBe(400);
    expect(point.body.issues[0].path).toBe('file.type');
    const junk = await upload(tokens.partner, 'field-boundary', pngBytes(), 'north.geojson');
    expect(junk.status).toBe(400);
  });

  it('keeps receipts from operators (404) and sends entry photos to their entry instead', async () => {
    const receipt = await upload(tokens.owner, 'receipt', pngBytes(), 'r.png');
    expect((await t.http().get(`/api/uploads/${receipt.body.id}`).set(bearer(tokens.operator))).status).toBe(404);
    expect((await upload(tokens.operator, 'receipt', pngBytes(), 'r.png')).status).toBe(403);
    const photo = await upload(tokens.operator, 'entry-photo', pngBytes(), 'pass.png');
    expect(photo.status).toBe(400);
    expect(photo.body.issues[0]).toMatchObject({ path: 'purpose', message: expect.stringContaining('/api/work-entries/:id/photos') });
  });

  it('refuses customers outright and bookkeepers as uploaders', async () => {
    const photo = await upload(tokens.owner, 'machine-photo', pngBytes(), 'm.png');
    expect((await t.http().get(`/api/uploads/${photo.body.id}`).set(bearer(tokens.customer))).status).toBe(403);
    expect((await upload(tokens.customer, 'machine-photo', pngBytes(), 'm.png')).status).toBe(403);
    expect((await upload(tokens.bookkeeper, 'receipt', pngBytes(), 'm.png')).status).toBe(403);
  });

  it("answers 404 for another operation's file", async () => {
    const theirs = await upload(otherTokens.owner, 'receipt', PDF, 'theirs.pdf');
    expect(theirs.status).toBe(201);
    expect((await t.http().get(`/api/uploads/${theirs.body.id}`).set(bearer(tokens.owner))).status).toBe(404);
    expect((await t.http().get(`/api/uploads/${theirs.body.id}`).set(bearer(otherTokens.bookkeeper))).status).toBe(200);
  });

  it('names the missing file and an unknown purpose', async () => {
    const noFile = await t.http().post('/api/uploads').set(bearer(tokens.owner)).field('purpose', 'receipt');
    expect(noFile.status).toBe(400);
    expect(noFile.body.issues[0].path).toBe('file');
    const badPurpose = await upload(tokens.owner, 'selfie', pngBytes(), 'a.png');
    expect(badPurpose.status).toBe(400);
    expect(badPurpose.body.issues[0].path).toBe('purpose');
    const twoFiles = await t.http().post('/api/uploads').set(bearer(tokens.owner)).field('purpose', 'receipt').attach('file', pngBytes(), 'a.png').attach('extra', pngBytes(), 'b.png');
    expect(twoFiles.status).toBe(400);
  });

  it('refuses to keep files inside a folder the server serves', () => {
    expect(() => new LocalDiskStorage('/srv/hitchbook/web/uploads', ['/srv/hitchbook/web'])).toThrow(/outside the served folder/);
    expect(() => new LocalDiskStorage('/srv/hitchbook/uploads', ['/srv/hitchbook/web'])).not.toThrow();
    expect(existsSync(t.config.uploadDir)).toBe(true);
  });
});
