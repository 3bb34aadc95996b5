import type { ParsedMail } from 'mailparser';
import type { SMTPServerEnvelope } from 'smtp-server';

export interface AttachmentSummary {
  index: number;
  filename: string;
  contentType: string;
  size: number;
}

export interface MessageSummary {
  id: string;
  date: string;
  from: string;
  /** Envelope recipients: who the message was actually delivered to, Bcc included. */
  to: string[];
  subject: string;
  attachments: AttachmentSummary[];
}

export interface MessageDetail extends MessageSummary {
  envelopeFrom: string;
  text: string;
  html: string | null;
  headers: Record<string, string>;
  /** Every http(s) link found in the HTML and text bodies, in order of appearance, without repeats. */
  links: string[];
}

export interface StoredAttachment extends AttachmentSummary {
  content: Buffer;
}

export interface StoredMessage extends MessageDetail {
  files: StoredAttachment[];
}

export function toStoredMessage(id: string, parsed: ParsedMail, envelope: SMTPServerEnvelope, receivedAt: Date): StoredMessage {
  const envelopeFrom = envelope.mailFrom ? envelope.mailFrom.address : '';
  const files: StoredAttachment[] = parsed.attachments.map((a, index) => ({
    index,
    filename: a.filename ?? `attachment-${index + 1}`,
    contentType: a.contentType,
    size: a.size ?? a.content.length,
    content: a.content,
  }));
  const html = typeof parsed.html === 'string' ? parsed.html : null;
  const text = parsed.text ?? '';
  return {
    id,
    date: receivedAt.toISOString(),
    from: formatAddresses(parsed.from) || envelopeFrom,
    envelopeFrom,
    to: envelope.rcptTo.map((r) => r.address),
    subject: parsed.subject ?? '',
    attachments: files.map(({ content: _content, ...summary }) => summary),
    text,
    html,
    headers: headerRecord(parsed.headerLines),
    links: findLinks(html ?? '', text),
    files,
  };
}

export function summaryOf(m: StoredMessage): MessageSummary {
  return { id: m.id, date: m.date, from: m.from, to: m.to, subject: m.subject, attachments: m.attachments };
}

export function detailOf(m: StoredMessage): MessageDetail {
  const { files: _files, ...detail } = m;
  return detail;
}

/** Raw header values, unfolded; a header that occurs more than once (Received) keeps every value, one per line. */
function headerRecord(lines: ParsedMail['headerLines']): Record<string, string> {
  const headers: Record<string, string> = {};
  for (const { key, line } of lines) {
    const value = line.slice(line.indexOf(':') + 1).replace(/\r?\n[ \t]+/g, ' ').trim();
    headers[key] = key in headers ? `${headers[key]}\n${value}` : value;
  }
  return headers;
}

function formatAddresses(from: ParsedMail['from']): string {
  return (from?.value ?? []).map((a) => (a.name ? `${a.name} <${a.address ?? ''}>` : (a.address ?? ''))).join(', ');
}

const HREF = /href\s*=\s*(?:"([^"]*)"|'([^']*)')/gi;
const BARE_URL = /https?:\/\/[^\s<>"')\]]+/g;

function findLinks(html: string, text: string): string[] {
  const found: string[] = [];
  for (const match of html.matchAll(HREF)) found.push(decodeAttribute(match[1] ?? match[2] ?? ''));
  for (const match of text.matchAll(BARE_URL)) found.push(match[0]);
  return [...new Set(found.filter((href) => /^https?:\/\//i.test(href)))];
}

function decodeAttribute(value: string): string {
  return value
    .replace(/&quot;/g, '"')
    .replace(/&#39;/g, "'")
    .replace(/&lt;/g, '<')
    .replace(/&gt;/g, '>')
    .replace(/&amp;/g, '&');
}
