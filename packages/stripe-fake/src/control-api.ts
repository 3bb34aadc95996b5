import type { IncomingMessage, ServerResponse } from 'node:http';
import { ApiError, invalidRequest, resourceMissing } from './api-error.js';
import { checkTypedCard } from './card-entry.js';
import { findSession, payCheckoutSession, renderSession } from './checkout-sessions.js';
import type { Fake } from './fake.js';
import { decodePathIds, mediaType, readBody, sendJson } from './http-util.js';
import { cardDeclined, cardError } from './payments.js';
import { renderPaymentIntent } from './stripe-objects.js';
import { isCardFailure } from './test-cards.js';

type Json = Record<string, unknown>;

interface ControlRoute {
  method: 'GET' | 'POST' | 'PUT';
  path: RegExp;
  summary: string;
  /** The JSON body's allowed members; any other is refused so a misspelt one is not silently ignored. */
  fields?: string[];
  handle(fake: Fake, ids: string[], body: Json, query: URLSearchParams): Promise<Json> | Json;
}

const BODY_LIMIT = 64 * 1024;
/** Events caused through the control API did not come from an API request, like a payer's. */
const FROM_CONTROL = { id: null, idempotency_key: null };

const ROUTES: ControlRoute[] = [
  {
    method: 'GET',
    path: /^\/_fake$/,
    summary: 'This list.',
    handle: () => ({ routes: ROUTES.map((r) => ({ method: r.method, path: pathLabel(r.path), summary: r.summary })) }),
  },
  {
    method: 'GET',
    path: /^\/_fake\/events$/,
    summary: 'Events, newest first, with their delivery status; filter with ?type= and ?object= (the id of the object in the event).',
    handle(fake, _ids, _body, query) {
      const type = query.get('type');
      const object = query.get('object');
      const events = [...fake.state.events.values()]
        .reverse()
        .filter((e) => (!type || e.type === type) && (!object || e.object.id === object))
        .map((e) => ({ id: e.id, type: e.type, created: e.created, object_id: e.object.id, delivery: fake.webhooks.statusOf(e.id) ?? 'pending' }));
      return { object: 'list', data: events };
    },
  },
  {
    method: 'GET',
    path: /^\/_fake\/webhook-attempts$/,
    summary: 'Every webhook POST in the order they were sent, with the status the endpoint answered; filter with ?event=.',
    handle(fake, _ids, _body, query) {
      const event = query.get('event');
      return { object: 'list', data: fake.webhooks.attempts().filter((a) => !event || a.event_id === event) };
    },
  },
  {
    method: 'GET',
    path: /^\/_fake\/webhook-endpoint$/,
    summary: 'Where events are sent, and whether they are being held.',
    handle: (fake) => ({ url: fake.webhooks.currentEndpoint?.url ?? null, held: fake.webhooks.isHeld }),
  },
  {
    method: 'PUT',
    path: /^\/_fake\/webhook-endpoint$/,
    summary: 'Send events to {"url", "secret"?} from now on (the secret defaults to the one the fake started with); {"url": null} stops sending.',
    fields: ['url', 'secret'],
    handle(fake, _ids, body) {
      if (body.url === null) {
        fake.webhooks.setEndpoint(null);
      } else {
        const url = requiredString(body, 'url');
        if (!/^https?:\/\/./.test(url)) throw invalidRequest(`url must be an http or https URL, got "${url}".`, { param: 'url' });
        fake.webhooks.setEndpoint({ url, secret: optionalString(body, 'secret') ?? fake.webhookSecret });
      }
      return { url: fake.webhooks.currentEndpoint?.url ?? null, held: fake.webhooks.isHeld };
    },
  },
  {
    method: 'POST',
    path: /^\/_fake\/webhooks\/hold$/,
    summary: 'Keep new events back until release, to deliver them in another order.',
    handle(fake) {
      fake.webhooks.hold();
      return { held: true };
    },
  },
  {
    method: 'POST',
    path: /^\/_fake\/webhooks\/release$/,
    summary: 'Send the held events one after another: the ids in {"order": [...]} first, then the rest as they happened.',
    fields: ['order'],
    async handle(fake, _ids, body) {
      const order = body.order ?? [];
      if (!Array.isArray(order) || !order.every((id) => typeof id === 'string')) throw invalidRequest('order must be a list of event ids.', { param: 'order' });
      try {
        return { released: await fake.webhooks.release(order) };
      } catch (error) {
        throw invalidRequest(`Cannot release in that order: ${(error as Error).message}.`, { param: 'order' });
      }
    },
  },
  {
    method: 'POST',
    path: /^\/_fake\/events\/([^/]+)\/resend$/,
    summary: 'Deliver an event again, same id and body, as a duplicate delivery.',
    handle(fake, [id]) {
      const event = fake.state.events.get(id!);
      if (!event) throw resourceMissing('event', id!);
      fake.resend(event);
      return { resent: event.id };
    },
  },
  {
    method: 'POST',
    path: /^\/_fake\/checkout\/sessions\/([^/]+)\/pay$/,
    summary:
      'Pay an open session as a payer would: {"card_number", "exp_month"?, "exp_year"?, "cvc"?, "email"?}. 200 with the session and PaymentIntent, or 402 with the card_error.',
    fields: ['card_number', 'exp_month', 'exp_year', 'cvc', 'email'],
    handle(fake, [id], body) {
      const session = findSession(fake, id!);
      const number = requiredString(body, 'card_number');
      const expiry = { month: optionalInteger(body, 'exp_month') ?? 12, year: optionalInteger(body, 'exp_year') ?? new Date().getUTCFullYear() + 3 };
      const cvc = optionalString(body, 'cvc') ?? (/^3[47]/.test(number) ? '1234' : '123');
      const typed = checkTypedCard({ number, expiry, cvc });
      if (isCardFailure(typed)) throw cardDeclined(cardError(typed));
      const declined = payCheckoutSession(fake, session, { card: typed.card, expiry: typed.expiry, email: optionalString(body, 'email') ?? null }, FROM_CONTROL);
      if (declined) throw cardDeclined(declined);
      const intent = fake.state.paymentIntents.get(session.paymentIntentId!)!;
      return { checkout_session: renderSession(fake, session), payment_intent: renderPaymentIntent(fake.state, intent) };
    },
  },
  {
    method: 'POST',
    path: /^\/_fake\/reset$/,
    summary: 'Forget every session, payment, refund, event, webhook attempt and idempotency key.',
    handle(fake) {
      fake.reset();
      return { reset: true };
    },
  },
];

/**
 * Serves /_fake, the fake's own API for tests and developers. Requests that change something must be
 * JSON, which a web page in a browser cannot send here without a CORS preflight this server never grants.
 */
export async function handleControl(fake: Fake, req: IncomingMessage, res: ServerResponse, url: URL): Promise<boolean> {
  const found = findRoute(req.method ?? 'GET', url.pathname);
  if (!found) return false;
  try {
    let body: Json = {};
    if (found.route.method !== 'GET') {
      if (mediaType(req) !== 'application/json') {
        req.resume();
        throw invalidRequest('Control requests that change something must be sent with Content-Type: application/json (an empty body is fine).', { status: 415 });
      }
      body = parseJsonObject(await readBody(req, BODY_LIMIT));
      const unknown = Object.keys(body).find((key) => !(found.route.fields ?? []).includes(key));
      if (unknown !== undefined) throw invalidRequest(`Received unknown parameter: ${unknown}`, { param: unknown, code: 'parameter_unknown' });
    }
    sendJson(res, 200, await found.route.handle(fake, found.ids, body, url.searchParams));
  } catch (error) {
    if (!(error instanceof ApiError)) throw error;
    sendJson(res, error.status, { error: error.body });
  }
  return true;
}

function findRoute(method: string, path: string): { route: ControlRoute; ids: string[] } | null {
  for (const route of ROUTES) {
    const match = route.method === method ? route.path.exec(path) : null;
    const ids = match && decodePathIds(match.slice(1));
    if (ids) return { route, ids };
  }
  return null;
}

function parseJsonObject(text: string): Json {
  if (text.trim() === '') return {};
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch (error) {
    throw invalidRequest(`The body is not valid JSON: ${(error as Error).message}`);
  }
  if (typeof value !== 'object' || value === null || Array.isArray(value)) throw invalidRequest('The body must be a JSON object.');
  return value as Json;
}

function requiredString(body: Json, key: string): string {
  const value = optionalString(body, key);
  if (value === undefined) throw invalidRequest(`Missing required param: ${key}.`, { param: key, code: 'parameter_missing' });
  return value;
}

function optionalString(body: Json, key: string): string | undefined {
  const value = body[key];
  if (value === undefined || value === null) return undefined;
  if (typeof value !== 'string' || value === '') throw invalidRequest(`${key} must be a non-empty string.`, { param: key });
  return value;
}

function optionalInteger(body: Json, key: string): number | undefined {
  const value = body[key];
  if (value === undefined || value === null) return undefined;
  if (!Number.isInteger(value)) throw invalidRequest(`${key} must be a whole number.`, { param: key });
  return value as number;
}

/** "/_fake/events/:id/resend" from its pattern, for the index. */
function pathLabel(pattern: RegExp): string {
  return pattern.source.replace(/^\^/, '').replace(/\$$/, '').replace(/\\\//g, '/').replace(/\(\[\^\/\]\+\)/g, ':id');
}
