import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { eq } from 'drizzle-orm';
import { fields, invoices, machines, memberships, meterReadings, operations, parties, uploads } from '@hitchbook/db';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addEntry, addNeighbourSheet, createBillingWorld, type BillingWorld } from '../modules/invoices/billing-world.fixture.js';
import { createOperation, signInAll, type OperationFixture } from '../test-support/fixtures.js';
import { waitForMail } from '../test-support/mailbox.js';
import { createTestApp, type TestApp } from '../test-support/test-app.js';

/** Requests a careless or hostile caller sends, each answered with a clear refusal and no change. */

let t: TestApp;
let fx: OperationFixture;
let world: BillingWorld<OperationFixture>;
let tok: Record<string, string>;

beforeAll(async () => {
  t = await createTestApp();
  fx = await createOperation(t.dbh.db, 'Hostile outfit');
  world = await createBillingWorld(t.dbh.db, fx);
  await addNeighbourSheet(t.dbh.db, world);
  tok = await signInAll(t, fx);
});
afterAll(() => t?.close());

const auth = (role: string) => ({ Authorization: `Bearer ${tok[role]}` });

describe('dates outside the years the product deals in', () => {
  it('refuses a meter reading dated in year 17 instead of failing after storing it', async () => {
    const res = await t
      .http()
      .post(`/api/machines/${world.machines.tractor}/meter-readings`)
      .set(auth('owner'))
      .send({ readAt: '0017-02-23T20:06:07+10:36', hours: '250.0' });
    expect(res.status).toBe(400);
    expect(res.body.issues).toEqual([expect.objectContaining({ path: 'readAt' })]);
    const stored = await t.dbh.db.select().from(meterReadings).where(eq(meterReadings.machineId, world.machines.tractor));
    expect(stored).toEqual([]);
  });

  it('refuses a work entry started in year 17', async () => {
    const res = await t
      .http()
      .post('/api/work-entries')
      .set(auth('owner'))
      .send({ workDate: '2025-06-02', workTypeId: world.workTypes.mowing, fieldId: world.fields.creekBottom, startedAt: '0017-06-02T07:00:00Z', hours: '2.00' });
    expect(res.status).toBe(400);
    expect(JSON.stringify(res.body.issues)).toContain('startedAt');
  });
});

describe('issuing a draft with nothing on it', () => {
  it('answers 409 naming the problem and takes no number', async () => {
    const [draft] = await t.dbh.db.insert(invoices).values({ operationId: fx.operationId, partyId: fx.customers[0], status: 'draft' }).returning({ id: invoices.id });
    const res = await t.http().post(`/api/invoices/${draft!.id}/issue`).set(auth('owner')).send({});
    expect(res.status).toBe(409);
    expect(res.body.message).toMatch(/no lines/);
    const [row] = await t.dbh.db.select().from(invoices).where(eq(invoices.id, draft!.id));
    expect(row).toMatchObject({ status: 'draft', number: null });
  });

  it('still issues a draft made from approved work', async () => {
    await addEntry(t.dbh.db, world, { workDate: '2025-06-03', workTypeId: world.workTypes.mowing, fieldId: world.fields.creekBottom, billToPartyId: fx.customers[0], hours: '2.00', acres: '10.000' });
    const draft = await t.http().post('/api/invoices/drafts').set(auth('owner')).send({ partyId: fx.customers[0], from: '2025-06-01', to: '2025-06-30' });
    expect(draft.status).toBe(201);
    const issued = await t.http().post(`/api/invoices/${draft.body.id}/issue`).set(auth('owner')).send({});
    expect(issued.status).toBe(200);
    expect(issued.body.status).toBe('issued');
  });
});

describe('header injection through names and e-mail addresses', () => {
  const CRLF_VALUES = ['Hill Farm\r\nBcc: someone@evil.example', 'Hill Farm\nBcc: someone@evil.example', 'Hill Farm\rX-Injected: 1'];
  const CRLF_EMAILS = ['neighbour@example.test\r\nBcc: someone@evil.example', 'neighbour@example.test\nCc: someone@evil.example', 'neighbour@example.test%0d%0aBcc:someone@evil.example'];

  it('refuses line breaks in party names and e-mail addresses, on create and on change', async () => {
    for (const name of CRLF_VALUES) {
      const res = await t.http().post('/api/parties').set(auth('owner')).send({ kind: 'customer', name, relationship: 'neighbour' });
      expect(res.status, JSON.stringify(name)).toBe(400);
      expect(res.body.issues).toEqual([expect.objectContaining({ path: 'name' })]);
      expect((await t.http().patch(`/api/parties/${fx.customers[0]}`).set(auth('owner')).send({ name })).status).toBe(400);
    }
    for (const email of CRLF_EMAILS) {
      const res = await t.http().post('/api/parties').set(auth('owner')).send({ kind: 'customer', name: 'Hill Farm', relationship: 'neighbour', email });
      expect(res.status, JSON.stringify(email)).toBe(400);
      expect(res.body.issues).toEqual([expect.objectContaining({ path: 'email' })]);
      expect((await t.http().patch(`/api/parties/${fx.customers[0]}`).set(auth('owner')).send({ email })).status).toBe(400);
    }
    const [party] = await t.dbh.db.select().from(parties).where(eq(parties.id, fx.customers[0]));
    expect(party!.name).not.toMatch(/[\r\n]/);
    expect(party!.email ?? '').not.toMatch(/[\r\n%]/);
  });

  it('refuses line breaks in invitations, in accepting one, and in the address an invoice is sent to', async () => {
    for (const name of CRLF_VALUES) {
      const res = await t.http().post('/api/users/invitations').set(auth('owner')).send({ email: 'helper@example.test', name, role: 'operator' });
      expect(res.status).toBe(400);
      const accept = await t.http().post('/api/auth/invitations/accept').send({ token: 'x'.repeat(32), name, password: 'long enough passphrase' });
      expect(accept.status).toBe(400);
      expect(JSON.stringify(accept.body.issues)).toContain('name');
    }
    for (const email of CRLF_EMAILS) {
      expect((await t.http().post('/api/users/invitations').set(auth('owner')).send({ email, name: 'Helper', role: 'operator' })).status).toBe(400);
      expect((await t.http().post('/api/auth/password-reset/request').send({ email })).status).toBe(400);
    }
    const [draft] = await t.dbh.db.insert(invoices).values({ operationId: fx.operationId, partyId: fx.customers[0], status: 'draft' }).returning({ id: invoices.id });
    const send = await t.http().post(`/api/invoices/${draft!.id}/send`).set(auth('owner')).send({ to: CRLF_EMAILS[0] });
    expect(send.status).toBe(400);
    expect(send.body.issues).toEqual([expect.objectContaining({ path: 'to' })]);
  });

  it('keeps a line break already stored in a name out of the mail headers: one recipient, one-line subject', async () => {
    const tag = Math.random().toString(36).slice(2, 8);
    const to = `hill-${tag}@example.test`;
    await t.dbh.db.update(operations).set({ name: `Hill Farm ${tag}\r\nBcc: someone@evil.example` }).where(eq(operations.id, fx.operationId));
    await t.dbh.db.update(parties).set({ email: to }).where(eq(parties.id, fx.customers[0]));
    await addEntry(t.dbh.db, world, { workDate: '2025-06-21', workTypeId: world.workTypes.mowing, fieldId: world.fields.creekBottom, billToPartyId: fx.customers[0], hours: '1.00', acres: '5.000' });
    const draft = await t.http().post('/api/invoices/drafts').set(auth('owner')).send({ partyId: fx.customers[0], from: '2025-06-21', to: '2025-06-21' });
    expect(draft.status).toBe(201);
    expect((await t.http().post(`/api/invoices/${draft.body.id}/issue`).set(auth('owner')).send({})).status).toBe(200);
    expect((await t.http().post(`/api/invoices/${draft.body.id}/send`).set(auth('owner')).send({})).status).toBeLessThan(300);
    const mail = await waitForMail(to, tag, 20_000);
    expect(mail.to).toEqual([to]);
    expect(mail.subject).not.toMatch(/[\r\n]/);
    const full = (await (await fetch(`${process.env.MAIL_API_URL!.replace(/\/$/, '')}/api/messages/${mail.id}`)).json()) as { headers: Record<string, string> };
    const headerNames = Object.keys(full.headers).map((h) => h.toLowerCase());
    expect(headerNames).not.toContain('bcc');
    expect(headerNames).not.toContain('x-injected');
  });
});

describe('NUL characters, which PostgreSQL text cannot hold', () => {
  it('refuses them in a search and in a body with 400 naming the field, not a database failure', async () => {
    const search = await t.http().get('/api/parties').query({ q: 'Hill\u0000' }).set(auth('owner'));
    expect(search.status).toBe(400);
    expect(search.body.issues).toEqual([{ path: 'q', message: 'Text may not contain NUL characters.' }]);
    const body = await t.http().patch(`/api/parties/${fx.customers[0]}`).set(auth('owner')).send({ notes: 'gate code\u00001234' });
    expect(body.status).toBe(400);
    expect(body.body.issues[0].path).toBe('notes');
  });
});

describe('names in scripts the PDF font cannot draw', () => {
  it('prints a 120-character name on the invoice inside the page, each undrawable character as "?"', async () => {
    const name = `Hill ${'漢字🚜'.repeat(38)}Farm`;
    await t.dbh.db.update(parties).set({ name, email: null }).where(eq(parties.id, fx.customers[0]));
    await addEntry(t.dbh.db, world, { workDate: '2025-06-25', workTypeId: world.workTypes.mowing, fieldId: world.fields.creekBottom, billToPartyId: fx.customers[0], hours: '1.00', acres: '5.000' });
    const draft = await t.http().post('/api/invoices/drafts').set(auth('owner')).send({ partyId: fx.customers[0], from: '2025-06-25', to: '2025-06-25' });
    expect((await t.http().post(`/api/invoices/${draft.body.id}/issue`).set(auth('owner')).send({})).status).toBe(200);
    const pdf = await t.http().get(`/api/invoices/${draft.body.id}/pdf`).set(auth('owner')).buffer(true).parse((res, cb) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(pdf.status).toBe(200);
    const file = join(mkdtempSync(join(tmpdir(), 'hb-pdf-')), 'invoice.pdf');
    writeFileSync(file, pdf.body as Buffer);
    const text = execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' });
    expect(text).toContain('Hill ???????');
    // Every word's right edge stays inside the 612 pt page less its 50 pt margin.
    const bbox = execFileSync('pdftotext', ['-bbox', file, '-'], { encoding: 'utf8' });
    const rightEdges = [...bbox.matchAll(/xMax="([\d.]+)"/g)].map((m) => Number(m[1]));
    expect(rightEdges.length).toBeGreaterThan(10);
    expect(Math.max(...rightEdges)).toBeLessThanOrEqual(562.5);
  });
});

describe('requests that reach past what the screens send', () => {
  it('answers 400 to upload ids that try to walk the file system, and 404 for an id that is not there', async () => {
    for (const id of ['..%2F..%2Fetc%2Fpasswd', '%2e%2e%2f%2e%2e%2fetc%2fpasswd', '..%5C..%5Cwindows%5Cwin.ini', 'x%00.png', `${world.machines.tractor}%2F..`]) {
      const res = await t.http().get(`/api/uploads/${id}`).set(auth('owner'));
      expect(res.status, id).toBe(400);
      expect(res.body.issues).toEqual([{ path: 'id', message: 'Must be a valid id.' }]);
    }
    expect((await t.http().get('/api/uploads/00000000-0000-4000-8000-000000000000').set(auth('owner'))).status).toBe(404);
  });

  it('refuses an SVG or a script named as an image, and a file name with a NUL trick', async () => {
    const svg = Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" onload="alert(1)"/>');
    const js = Buffer.from('fetch("/api/auth/me").then(r => r.text()).then(alert)');
    for (const [data, name] of [[svg, 'receipt.png'], [svg, 'receipt.svg'], [js, 'receipt.jpg'], [js, 'a.php%00.jpg']] as const) {
      const res = await t.http().post('/api/uploads').set(auth('owner')).field('purpose', 'receipt').attach('file', data, { filename: name, contentType: 'image/png' });
      expect(res.status, name).toBe(400);
      expect(res.body.issues[0].path).toBe('file');
    }
    expect(await t.dbh.db.select().from(uploads).where(eq(uploads.operationId, fx.operationId))).toEqual([]);
  });

  it('refuses operation ids, roles and states smuggled into bodies, and leaves the rows as they were', async () => {
    const other = await createOperation(t.dbh.db, 'Other outfit');
    const smuggled = [
      ['PATCH', `/api/parties/${fx.customers[0]}`, { operationId: other.operationId }],
      ['PATCH', `/api/machines/${world.machines.tractor}`, { operationId: other.operationId }],
      ['PATCH', `/api/machines/${world.machines.tractor}`, { id: other.operationId }],
      ['POST', '/api/parties', { kind: 'customer', name: 'Smuggled', relationship: 'neighbour', operationId: other.operationId }],
      ['PATCH', `/api/invoices/${world.fx.customers[0]}`, { status: 'paid' }],
      ['POST', '/api/users/invitations', { email: 'smuggled@example.test', name: 'Smuggled', role: 'operator', userId: fx.members.owner.userId }],
    ] as const;
    for (const [method, path, body] of smuggled) {
      const res = await t.http()[method === 'POST' ? 'post' : 'patch'](path).set(auth('owner')).send(body);
      expect(res.status, `${method} ${path}`).toBe(400);
      expect(JSON.stringify(res.body.issues), `${method} ${path}`).toMatch(/Unknown field/);
    }
    const [machine] = await t.dbh.db.select().from(machines).where(eq(machines.id, world.machines.tractor));
    expect(machine!.operationId).toBe(fx.operationId);
    // A partner may not promote itself, and the owner may not leave the operation without an owner.
    expect((await t.http().patch(`/api/users/${fx.members.partner.membershipId}`).set(auth('partner')).send({ role: 'owner' })).status).toBe(403);
    expect((await t.http().patch(`/api/users/${fx.members.owner.membershipId}`).set(auth('owner')).send({ role: 'bookkeeper' })).status).toBe(409);
    const [partner] = await t.dbh.db.select().from(memberships).where(eq(memberships.id, fx.members.partner.membershipId));
    expect(partner!.role).toBe('partner');
  });

  it('refuses absurd page sizes, unknown sort columns and repeated parameters with 400', async () => {
    for (const query of ['pageSize=100000', 'pageSize=0', 'pageSize=-1', 'page=0', 'page=1e9', 'sort=password_hash', 'sort=name;drop table parties', 'pageSize=1&pageSize=2', 'sort=name&sort=kind', 'operationId=x']) {
      for (const path of ['/api/parties', '/api/work-entries', '/api/invoices', '/api/machines']) {
        const res = await t.http().get(`${path}?${query}`).set(auth('owner'));
        expect(res.status, `${path}?${query}`).toBe(400);
      }
    }
  });

  it('treats SQL and LIKE wildcards in a search as plain text', async () => {
    for (const q of ["' OR 1=1 --", '%', '_', '\\', "Neighbour%' --"]) {
      const res = await t.http().get('/api/parties').query({ q }).set(auth('owner'));
      expect(res.status, q).toBe(200);
      expect(res.body.items, q).toEqual([]);
    }
  });

  it('takes an access token from the Authorization header only, never from the query string or a cookie', async () => {
    const token = tok.owner!;
    for (const query of ['access_token', 'token', 'jwt', 'authorization']) {
      expect((await t.http().get(`/api/auth/me?${query}=${token}`)).status, query).toBe(401);
    }
    expect((await t.http().get('/api/auth/me').set('Cookie', `access_token=${token}; hb_access=${token}`)).status).toBe(401);
    expect((await t.http().get('/api/auth/me').set('Authorization', `Bearer ${token}`)).status).toBe(200);
  });
});

describe('field boundaries no field could have', () => {
  it('refuses a ring round the whole earth with 400 instead of overflowing the acres column', async () => {
    const earth = { type: 'Polygon', coordinates: [[[-180, -90], [180, -90], [180, 90], [-180, 90], [-180, -90]]] };
    const res = await t.http().post('/api/fields').set(auth('owner')).send({ name: 'Everywhere', acres: '10', boundary: earth });
    expect(res.status).toBe(400);
    expect(res.body.issues).toEqual([{ path: 'boundary', message: expect.stringMatching(/more than the 100,000 a field may have/) }]);
    const stored = await t.dbh.db.select().from(fields).where(eq(fields.operationId, fx.operationId));
    expect(stored.map((f) => f.name)).not.toContain('Everywhere');
    const patched = await t.http().patch(`/api/fields/${world.fields.schoolhouse}`).set(auth('owner')).send({ boundary: earth });
    expect(patched.status).toBe(400);
  });
});
