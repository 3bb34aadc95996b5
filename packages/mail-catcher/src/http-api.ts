import type { IncomingMessage, ServerResponse } from 'node:http';
import { detailOf, summaryOf } from './message.js';
import type { MessageStore } from './message-store.js';
import { PAGE_SECURITY_POLICY, renderInbox, renderMessage, renderNotFound } from './inbox-pages.js';

type Handler = (req: IncomingMessage, res: ServerResponse, params: string[], query: URLSearchParams) => void;

interface Route {
  method: string;
  pattern: RegExp;
  handle: Handler;
}

export function createRequestHandler(store: MessageStore): (req: IncomingMessage, res: ServerResponse) => void {
  const routes: Route[] = [
    {
      method: 'GET',
      pattern: /^\/api\/messages$/,
      handle: (_req, res, _params, query) => {
        const to = query.get('to')?.toLowerCase();
        const messages = store.list().filter((m) => !to || m.to.some((r) => r.toLowerCase() === to));
        sendJson(res, 200, messages.map(summaryOf));
      },
    },
    {
      method: 'DELETE',
      pattern: /^\/api\/messages$/,
      handle: (_req, res) => {
        store.clear();
        res.writeHead(204).end();
      },
    },
    {
      method: 'GET',
      pattern: /^\/api\/messages\/([^/]+)$/,
      handle: (_req, res, [id]) => {
        const message = store.get(id!);
        if (!message) return sendJson(res, 404, { error: `No message with id ${id}` });
        sendJson(res, 200, detailOf(message));
      },
    },
    {
      method: 'GET',
      pattern: /^\/api\/messages\/([^/]+)\/attachments\/([^/]+)$/,
      handle: (_req, res, [id, index]) => {
        const message = store.get(id!);
        if (!message) return sendJson(res, 404, { error: `No message with id ${id}` });
        const file = /^\d+$/.test(index!) ? message.files[Number(index)] : undefined;
        if (!file) {
          return sendJson(res, 404, {
            error: `Message ${id} has no attachment ${index}; it has ${message.files.length} (numbered from 0)`,
          });
        }
        res.writeHead(200, {
          'content-type': file.contentType,
          'content-length': file.content.length,
          'content-disposition': attachmentDisposition(file.filename),
          'x-content-type-options': 'nosniff',
        });
        res.end(file.content);
      },
    },
    {
      method: 'GET',
      pattern: /^\/$/,
      handle: (_req, res) => sendHtml(res, 200, renderInbox(store.list())),
    },
    {
      method: 'GET',
      pattern: /^\/messages\/([^/]+)$/,
      handle: (_req, res, [id]) => {
        const message = store.get(id!);
        if (!message) return sendHtml(res, 404, renderNotFound(`No message with id ${id}; it may have been cleared.`));
        sendHtml(res, 200, renderMessage(message));
      },
    },
  ];

  return (req, res) => {
    const url = new URL(req.url ?? '/', 'http://mail-catcher.invalid');
    let path: string;
    try {
      path = decodeURIComponent(url.pathname);
    } catch {
      return sendJson(res, 400, { error: `Malformed path ${url.pathname}` });
    }
    const matching = routes.filter((r) => r.pattern.test(path));
    if (matching.length === 0) return sendJson(res, 404, { error: `Nothing at ${path}` });
    const route = matching.find((r) => r.method === req.method);
    if (!route) {
      const allowed = matching.map((r) => r.method).join(', ');
      res.setHeader('allow', allowed);
      return sendJson(res, 405, { error: `${req.method} is not supported on ${path}; use ${allowed}` });
    }
    route.handle(req, res, path.match(route.pattern)!.slice(1), url.searchParams);
  };
}

function sendJson(res: ServerResponse, status: number, body: unknown): void {
  res.writeHead(status, { 'content-type': 'application/json; charset=utf-8', 'cache-control': 'no-store' });
  res.end(JSON.stringify(body));
}

function sendHtml(res: ServerResponse, status: number, body: string): void {
  res.writeHead(status, {
    'content-type': 'text/html; charset=utf-8',
    'content-security-policy': PAGE_SECURITY_POLICY,
    'x-content-type-options': 'nosniff',
    'referrer-policy': 'no-referrer',
    'cache-control': 'no-store',
  });
  res.end(body);
}

/** An ASCII fallback name plus the RFC 5987 UTF-8 name, so "Rechnung März.pdf" downloads under its own name. */
function attachmentDisposition(filename: string): string {
  const fallback = filename.replace(/[^\x20-\x7e]/g, '_').replace(/["\\]/g, '_');
  return `attachment; filename="${fallback}"; filename*=UTF-8''${encodeURIComponent(filename)}`;
}
