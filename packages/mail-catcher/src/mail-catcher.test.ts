import { afterEach, describe, expect, it } from 'vitest';
import nodemailer from 'nodemailer';
import { startMailCatcher, type MessageDetail, type MessageSummary, type RunningMailCatcher } from './index.js';

const running: RunningMailCatcher[] = [];

async function catcher(options: Parameters<typeof startMailCatcher>[0] = {}) {
  const started = await startMailCatcher(options);
  running.push(started);
  const base = `http://127.0.0.1:${started.httpPort}`;
  const transport = nodemailer.createTransport({ host: '127.0.0.1', port: started.smtpPort, secure: false, ignoreTLS: true });
  return { started, base, transport };
}

async function getJson<T>(url: string): Promise<T> {
  const res = await fetch(url);
  expect(res.status).toBe(200);
  return (await res.json()) as T;
}

afterEach(async () => {
  await Promise.all(running.splice(0).map((c) => c.stop()));
});

const PDF = Buffer.from('%PDF-1.4\n%hitchbook\n');

describe('mail catcher', () => {
  it('lists a delivered message with its envelope recipients, decoded subject and attachment metadata', async () => {
    const { base, transport } = await catcher();
    await transport.sendMail({
      from: 'Hitchbook <no-reply@hitchbook.test>',
      to: ['owner@hitchbook.test', 'partner@hitchbook.test'],
      bcc: 'bookkeeper@hitchbook.test',
      subject: 'Invoice 2026-014 – €1,240.50 for combining',
      text: 'See attached.',
      attachments: [{ filename: 'invoice-2026-014.pdf', content: PDF, contentType: 'application/pdf' }],
    });

    const list = await getJson<MessageSummary[]>(`${base}/api/messages`);
    expect(list).toHaveLength(1);
    expect(list[0]).toMatchObject({
      from: 'Hitchbook <no-reply@hitchbook.test>',
      to: ['owner@hitchbook.test', 'partner@hitchbook.test', 'bookkeeper@hitchbook.test'],
      subject: 'Invoice 2026-014 – €1,240.50 for combining',
      attachments: [{ index: 0, filename: 'invoice-2026-014.pdf', contentType: 'application/pdf', size: PDF.length }],
    });
    expect(Date.parse(list[0]!.date)).not.toBeNaN();
  });

  it('serves an attachment with its bytes, type and file name', async () => {
    const { base, transport } = await catcher();
    await transport.sendMail({
      from: 'no-reply@hitchbook.test',
      to: 'customer@hitchbook.test',
      subject: 'Rechnung',
      text: 'x',
      attachments: [{ filename: 'Rechnung März.pdf', content: PDF, contentType: 'application/pdf' }],
    });
    const [message] = await getJson<MessageSummary[]>(`${base}/api/messages`);

    const res = await fetch(`${base}/api/messages/${message!.id}/attachments/0`);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toBe('application/pdf');
    expect(res.headers.get('content-disposition')).toContain(`filename*=UTF-8''Rechnung%20M%C3%A4rz.pdf`);
    expect(Buffer.from(await res.arrayBuffer()).equals(PDF)).toBe(true);
  });

  it('returns text, html, headers and the links of a message', async () => {
    const { base, transport } = await catcher();
    await transport.sendMail({
      from: 'no-reply@hitchbook.test',
      to: 'operator@hitchbook.test',
      subject: 'Confirm your email',
      text: 'Open http://localhost:3000/verify?token=abc to confirm.',
      html: '<p><a href="http://localhost:3000/verify?token=abc&amp;next=%2F">Confirm</a></p>',
      headers: { 'X-Hitchbook-Kind': 'verify-email' },
    });
    const [summary] = await getJson<MessageSummary[]>(`${base}/api/messages`);

    const detail = await getJson<MessageDetail>(`${base}/api/messages/${summary!.id}`);
    expect(detail.text.trim()).toBe('Open http://localhost:3000/verify?token=abc to confirm.');
    expect(detail.html).toContain('>Confirm</a>');
    expect(detail.headers['x-hitchbook-kind']).toBe('verify-email');
    expect(detail.headers['subject']).toBe('Confirm your email');
    expect(detail.links).toEqual(['http://localhost:3000/verify?token=abc&next=%2F', 'http://localhost:3000/verify?token=abc']);
  });

  it('lists newest first and filters by envelope recipient, ignoring case', async () => {
    const { base, transport } = await catcher();
    await transport.sendMail({ from: 'a@hitchbook.test', to: 'customer@hitchbook.test', subject: 'first', text: '1' });
    await transport.sendMail({ from: 'a@hitchbook.test', to: 'customer2@hitchbook.test', subject: 'second', text: '2' });

    const all = await getJson<MessageSummary[]>(`${base}/api/messages`);
    expect(all.map((m) => m.subject)).toEqual(['second', 'first']);
    const forOne = await getJson<MessageSummary[]>(`${base}/api/messages?to=${encodeURIComponent('Customer@Hitchbook.test')}`);
    expect(forOne.map((m) => m.subject)).toEqual(['first']);
  });

  it('forgets every message on DELETE', async () => {
    const { base, transport } = await catcher();
    await transport.sendMail({ from: 'a@hitchbook.test', to: 'owner@hitchbook.test', subject: 'gone soon', text: '1' });

    const res = await fetch(`${base}/api/messages`, { method: 'DELETE' });
    expect(res.status).toBe(204);
    expect(await getJson<MessageSummary[]>(`${base}/api/messages`)).toEqual([]);
  });

  it('keeps only the newest messages beyond its limit', async () => {
    const { base, transport } = await catcher({ maxMessages: 2 });
    for (const subject of ['one', 'two', 'three']) {
      await transport.sendMail({ from: 'a@hitchbook.test', to: 'owner@hitchbook.test', subject, text: subject });
    }
    const list = await getJson<MessageSummary[]>(`${base}/api/messages`);
    expect(list.map((m) => m.subject)).toEqual(['three', 'two']);
  });

  it('refuses a message larger than 10 MB and keeps nothing of it', async () => {
    const { base, transport } = await catcher();
    const tooBig = transport.sendMail({
      from: 'a@hitchbook.test',
      to: 'owner@hitchbook.test',
      subject: 'huge',
      text: 'x',
      attachments: [{ filename: 'scan.bin', content: Buffer.alloc(11 * 1024 * 1024, 7) }],
    });
    await expect(tooBig).rejects.toMatchObject({ responseCode: 552 });
    expect(await getJson<MessageSummary[]>(`${base}/api/messages`)).toEqual([]);
  });

  it('escapes a hostile subject, sender and body in the inbox and message pages', async () => {
    const { base, transport } = await catcher();
    const hostile = '<script>alert(1)</script><img src=x onerror=alert(2)>"\'&';
    await transport.sendMail({
      from: { name: '<b>Evil</b>', address: 'evil@hitchbook.test' },
      to: 'owner@hitchbook.test',
      subject: hostile,
      text: `click <here> http://example.test/?a=1&b="2"`,
      html: '<p>hi</p>"></iframe><script>alert(3)</script>',
    });
    const [summary] = await getJson<MessageSummary[]>(`${base}/api/messages`);

    const inbox = await fetch(`${base}/`);
    expect(inbox.headers.get('content-type')).toBe('text/html; charset=utf-8');
    expect(inbox.headers.get('content-security-policy')).toContain("default-src 'none'");
    const inboxHtml = await inbox.text();
    expect(inboxHtml).not.toContain('<script>');
    expect(inboxHtml).not.toContain('<img src=x');
    expect(inboxHtml).not.toContain('<b>Evil</b>');
    expect(inboxHtml).toContain('&lt;script&gt;alert(1)&lt;/script&gt;&lt;img src=x onerror=alert(2)&gt;&quot;&#39;&amp;');

    const page = await (await fetch(`${base}/messages/${summary!.id}`)).text();
    expect(page).not.toContain('<script>');
    expect(page).not.toContain('</iframe><script');
    expect(page).toMatch(/<iframe [^>]*sandbox="allow-popups allow-popups-to-escape-sandbox"[^>]*srcdoc="&lt;base target=&quot;_blank&quot;&gt;&lt;p&gt;hi/);
    expect(page).not.toContain('allow-scripts');
    expect(page).toContain('click &lt;here&gt; <a href="http://example.test/?a=1&amp;b=" target="_blank" rel="noopener noreferrer">');
  });

  it('answers unknown messages, attachments, paths and methods with a clear error', async () => {
    const { base, transport } = await catcher();
    await transport.sendMail({ from: 'a@hitchbook.test', to: 'owner@hitchbook.test', subject: 'plain', text: '1' });
    const [summary] = await getJson<MessageSummary[]>(`${base}/api/messages`);

    const noMessage = await fetch(`${base}/api/messages/999`);
    expect(noMessage.status).toBe(404);
    expect(await noMessage.json()).toEqual({ error: 'No message with id 999' });

    const noAttachment = await fetch(`${base}/api/messages/${summary!.id}/attachments/0`);
    expect(noAttachment.status).toBe(404);
    expect(await noAttachment.json()).toEqual({ error: `Message ${summary!.id} has no attachment 0; it has 0 (numbered from 0)` });

    const wrongMethod = await fetch(`${base}/api/messages`, { method: 'POST' });
    expect(wrongMethod.status).toBe(405);
    expect(wrongMethod.headers.get('allow')).toBe('GET, DELETE');

    expect((await fetch(`${base}/nowhere`)).status).toBe(404);
    expect((await fetch(`${base}/messages/999`)).status).toBe(404);
  });

  it('says which port is taken when it cannot listen', async () => {
    const { started } = await catcher();
    await expect(startMailCatcher({ smtpPort: started.smtpPort })).rejects.toThrow(
      `Mail catcher SMTP could not start: port ${started.smtpPort} on 127.0.0.1 is already in use`,
    );
    await expect(startMailCatcher({ httpPort: started.httpPort })).rejects.toThrow(
      `Mail catcher web inbox could not start: port ${started.httpPort} on 127.0.0.1 is already in use`,
    );
  });
});
