import { execFileSync } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { eq, sql } from 'drizzle-orm';
import { invoices, parties } from '@hitchbook/db';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createOperation, signInAll, type OperationFixture } from '../../test-support/fixtures.js';
import { waitForMail } from '../../test-support/mailbox.js';
import { TcpProxy } from '../../test-support/tcp-proxy.js';
import { createTestApp, testConfig, type TestApp } from '../../test-support/test-app.js';
import { addEntry, addNeighbourSheet, createBillingWorld, type BillingWorld } from './billing-world.fixture.js';
import { INVOICE_MAIL_QUEUE } from './invoice-mail.js';

let t: TestApp;
let world: BillingWorld<OperationFixture>;
let tokens: Awaited<ReturnType<typeof signInAll>>;
let neighbour: string;
let neighbourEmail: string;
const bearer = (token: string) => ({ Authorization: `Bearer ${token}` });
const scratch = mkdtempSync(join(tmpdir(), 'hb-invoice-pdf-'));

beforeAll(async () => {
  t = await createTestApp();
  world = await createBillingWorld(t.dbh.db, await createOperation(t.dbh.db));
  tokens = await signInAll(t, world.fx);
  neighbour = world.fx.customers[0];
  // A unique address per run, so the mail catcher's earlier messages never answer for this run.
  neighbourEmail = `brandvold-${randomUUID().slice(0, 8)}@example.test`;
  await t.dbh.db.update(parties).set({ name: 'Marisol Brandvold', email: neighbourEmail, address: '2870 Pike Hollow Road' }).where(eq(parties.id, neighbour));
  await addNeighbourSheet(t.dbh.db, world);
});
afterAll(async () => {
  rmSync(scratch, { recursive: true, force: true });
  await t.close();
});

async function issuedInvoice(app: TestApp, workDate: string): Promise<{ id: string; numberLabel: string }> {
  await addEntry(app.dbh.db, world, { workDate, workTypeId: world.workTypes.mowing, fieldId: world.fields.creekBottom, billToPartyId: neighbour, hours: '2.00', acres: '10.000' });
  const d = await app.http().post('/api/invoices/drafts').set(bearer(tokens.owner)).send({ partyId: neighbour, from: workDate, to: workDate });
  const issued = await app.http().post(`/api/invoices/${d.body.id}/issue`).set(bearer(tokens.owner)).send({});
  expect(issued.status).toBe(200);
  return issued.body;
}

/** The words on the pages, by pdftotext when installed, else what the document info carries in the clear. */
function textOf(pdf: Buffer): string {
  if (!existsSync('/usr/bin/pdftotext')) return pdf.toString('latin1');
  const file = join(scratch, `${randomUUID()}.pdf`);
  writeFileSync(file, pdf);
  return execFileSync('/usr/bin/pdftotext', ['-layout', file, '-'], { encoding: 'utf8' });
}

const download = (id: string, token: string) => t.http().get(`/api/invoices/${id}/pdf`).set(bearer(token)).responseType('blob');

describe('invoice PDF', () => {
  it('prints the operation, the party, each line, the totals, the terms and how to pay', async () => {
    const invoice = await issuedInvoice(t, '2025-04-07');
    const res = await download(invoice.id, tokens.bookkeeper);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    expect(res.headers['content-disposition']).toBe(`attachment; filename="${invoice.numberLabel}.pdf"`);
    const pdf = res.body as Buffer;
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    const text = textOf(pdf);
    expect(text).toContain(invoice.numberLabel);
    if (existsSync('/usr/bin/pdftotext')) {
      for (const words of ['Test outfit', 'Marisol Brandvold', '2870 Pike Hollow Road', '2025-04-07', 'Creek Bottom', 'Mowing (rotary)', '$18.50', '$185.00', '$25.00', '$210.00', 'Due within 21 days', `http://hitchbook.test/pay/${invoice.id}`]) {
        expect(text, words).toContain(words);
      }
    }
  });

  it('prints names with Latin Extended letters as letters, not as missing glyphs', async () => {
    expect(existsSync('/usr/bin/pdftotext'), 'npm test installs poppler-utils for this check').toBe(true);
    const name = 'Dvořák & Łukasz Müller-Šimek';
    await t.dbh.db.update(parties).set({ name, address: 'Příčná 7, Żółkiewka' }).where(eq(parties.id, neighbour));
    try {
      const invoice = await issuedInvoice(t, '2025-04-10');
      const text = textOf((await download(invoice.id, tokens.owner)).body as Buffer);
      expect(text).toContain(name);
      expect(text).toContain('Příčná 7, Żółkiewka');
    } finally {
      await t.dbh.db.update(parties).set({ name: 'Marisol Brandvold', address: '2870 Pike Hollow Road' }).where(eq(parties.id, neighbour));
    }
  });

  it('prints a credit note with the invoice it credits', async () => {
    const invoice = await issuedInvoice(t, '2025-04-08');
    const note = await t.http().post(`/api/invoices/${invoice.id}/credit-notes`).set(bearer(tokens.owner)).send({ reason: 'Rain stopped the work' });
    const text = textOf((await download(note.body.id, tokens.owner)).body as Buffer);
    expect(text).toContain(note.body.numberLabel);
    if (existsSync('/usr/bin/pdftotext')) {
      expect(text).toContain(`Credits invoice ${invoice.numberLabel}`);
      expect(text).toContain('-$210.00');
      expect(text).toContain('Rain stopped the work');
    }
  });

  it('lets the invoice’s own customer download it, and nobody else outside the money roles', async () => {
    const invoice = await issuedInvoice(t, '2025-04-09');
    expect((await download(invoice.id, tokens.customer)).status).toBe(200);
    expect((await download(invoice.id, tokens.customer2)).status).toBe(404);
    expect((await download(invoice.id, tokens.operator)).status).toBe(403);
  });
});

describe('sending an invoice', () => {
  it('queues an e-mail that arrives with the PDF attached and a pay link', async () => {
    const invoice = await issuedInvoice(t, '2025-04-14');
    const res = await t.http().post(`/api/invoices/${invoice.id}/send`).set(bearer(tokens.owner)).send({});
    expect(res.status).toBe(202);
    expect(res.body).toEqual({ queued: true, to: neighbourEmail });

    const mail = await waitForMail(neighbourEmail, `Invoice ${invoice.numberLabel}`);
    expect(mail.subject).toBe(`Invoice ${invoice.numberLabel} from ${(await t.http().get(`/api/invoices/${invoice.id}`).set(bearer(tokens.owner))).body.issuer.name}`);
    expect(mail.links).toContain(`http://hitchbook.test/pay/${invoice.id}`);
    expect(mail.text).toContain('Amount due: $210.00');
    expect(mail.attachments).toEqual([expect.objectContaining({ filename: `${invoice.numberLabel}.pdf`, contentType: 'application/pdf' })]);
    const attached = Buffer.from(await (await fetch(`${process.env.MAIL_API_URL}/api/messages/${mail.id}/attachments/0`)).arrayBuffer());
    expect(attached.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(textOf(attached)).toContain(invoice.numberLabel);

    const [row] = await t.dbh.db.select({ sentAt: invoices.sentAt }).from(invoices).where(eq(invoices.id, invoice.id));
    expect(row?.sentAt).toBeInstanceOf(Date);
  });

  it('refuses to send a draft, and asks for an address when the party has none', async () => {
    await addEntry(t.dbh.db, world, { workDate: '2025-04-15', workTypeId: world.workTypes.mowing, fieldId: world.fields.creekBottom, billToPartyId: neighbour, hours: '2.00', acres: '10.000' });
    const d = await t.http().post('/api/invoices/drafts').set(bearer(tokens.owner)).send({ partyId: neighbour, from: '2025-04-15', to: '2025-04-15' });
    expect((await t.http().post(`/api/invoices/${d.body.id}/send`).set(bearer(tokens.owner)).send({})).status).toBe(409);

    const invoice = await issuedInvoice(t, '2025-04-16');
    await t.dbh.db.update(parties).set({ email: null }).where(eq(parties.id, neighbour));
    try {
      const noAddress = await t.http().post(`/api/invoices/${invoice.id}/send`).set(bearer(tokens.owner)).send({});
      expect(noAddress.status).toBe(400);
      expect(noAddress.body.issues[0].path).toBe('to');
      const injected = await t.http().post(`/api/invoices/${invoice.id}/send`).set(bearer(tokens.owner)).send({ to: 'a@example.test\r\nBcc: evil@example.test' });
      expect(injected.status).toBe(400);
      expect((await t.http().post(`/api/invoices/${invoice.id}/send`).set(bearer(tokens.bookkeeper)).send({})).status).toBe(403);
    } finally {
      await t.dbh.db.update(parties).set({ email: neighbourEmail }).where(eq(parties.id, neighbour));
    }
  });

  it('issues and sends while the mail server is down, and delivers once it is back', async () => {
    const base = testConfig();
    const smtp = new TcpProxy(base.smtpHost, base.smtpPort);
    await smtp.open();
    await smtp.cut();
    // Its own queue schema: no other test's worker can deliver (or be slowed by) these jobs.
    const schema = `pgboss_invoice_mail_${randomUUID().slice(0, 8)}`;
    const down = await createTestApp({ smtpPort: smtp.port, jobs: { ...base.jobs, schema, pollingIntervalSeconds: 0.5, mailRetryDelaySeconds: 1 } });
    try {
      const invoice = await issuedInvoice(down, '2025-04-21');
      const sent = await down.http().post(`/api/invoices/${invoice.id}/send`).set(bearer(tokens.owner)).send({});
      expect(sent.status).toBe(202);

      const deadline = Date.now() + 15_000;
      let job: { state: string; retry_count: number } | undefined;
      while (Date.now() < deadline && !(job && job.retry_count >= 1)) {
        await new Promise((r) => setTimeout(r, 250));
        job = (await t.dbh.db.execute<{ state: string; retry_count: number }>(sql`select state, retry_count from ${sql.identifier(schema)}.job where name = ${INVOICE_MAIL_QUEUE}`)).rows[0];
      }
      expect(job?.retry_count).toBeGreaterThanOrEqual(1);
      expect(job?.state).not.toBe('completed');

      await smtp.open(smtp.port);
      const mail = await waitForMail(neighbourEmail, `Invoice ${invoice.numberLabel}`, 20_000);
      expect(mail.attachments).toHaveLength(1);
    } finally {
      await down.close();
      await smtp.cut();
      await t.dbh.db.execute(sql`drop schema if exists ${sql.identifier(schema)} cascade`);
    }
  });
});
