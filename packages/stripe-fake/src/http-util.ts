import type { IncomingMessage, ServerResponse } from 'node:http';
import { invalidRequest } from './api-error.js';

/** Reads the whole request body as UTF-8, refusing more than `limit` bytes with Stripe's error shape (413). */
export function readBody(req: IncomingMessage, limit: number): Promise<string> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    let size = 0;
    req.on('data', (chunk: Buffer) => {
      size += chunk.length;
      if (size > limit) {
        req.removeAllListeners('data');
        req.resume();
        reject(invalidRequest(`The request body is larger than ${limit} bytes.`, { status: 413 }));
        return;
      }
      chunks.push(chunk);
    });
    req.on('end', () => resolve(Buffer.concat(chunks).toString('utf8')));
    req.on('error', reject);
  });
}

/** The media type of the request without parameters, lower-cased; '' when there is none. */
export function mediaType(req: IncomingMessage): string {
  return (req.headers['content-type'] ?? '').split(';')[0]!.trim().toLowerCase();
}

export function header(req: IncomingMessage, name: string): string | undefined {
  const value = req.headers[name];
  return Array.isArray(value) ? value[0] : value;
}

export function sendJson(res: ServerResponse, status: number, body: unknown, headers: Record<string, string> = {}): void {
  sendJsonText(res, status, JSON.stringify(body), headers);
}

export function sendJsonText(res: ServerResponse, status: number, text: string, headers: Record<string, string> = {}): void {
  res.writeHead(status, {
    'content-type': 'application/json; charset=utf-8',
    'cache-control': 'no-cache, no-store',
    'x-content-type-options': 'nosniff',
    ...headers,
  });
  res.end(text);
}

export function sendHtml(res: ServerResponse, status: number, html: string, contentSecurityPolicy: string): void {
  res.writeHead(status, {
    'content-type': 'text/html; charset=utf-8',
    'content-security-policy': contentSecurityPolicy,
    'x-content-type-options': 'nosniff',
    'x-frame-options': 'DENY',
    'referrer-policy': 'same-origin',
    'cache-control': 'no-store',
  });
  res.end(html);
}

/** Decodes the ids captured from a path; a malformed escape is a 404 like any unknown URL. */
export function decodePathIds(ids: string[]): string[] | null {
  try {
    return ids.map((id) => decodeURIComponent(id));
  } catch {
    return null;
  }
}
