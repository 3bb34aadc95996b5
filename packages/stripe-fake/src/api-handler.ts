import type { IncomingMessage, ServerResponse } from 'node:http';
import { ApiError, errorBody, invalidRequest } from './api-error.js';
import type { ApiRoute } from './api-route.js';
import { chargeRoutes } from './charges.js';
import { checkoutSessionRoutes } from './checkout-sessions.js';
import { eventRoutes } from './events.js';
import type { Fake } from './fake.js';
import { parseForm, type FormHash } from './form-encoding.js';
import { decodePathIds, header, mediaType, readBody, sendJson, sendJsonText } from './http-util.js';
import { fingerprintOf, MAX_KEY_LENGTH } from './idempotency.js';
import { newId } from './ids.js';
import { Params } from './params.js';
import { paymentIntentRoutes } from './payment-intents.js';
import { refundRoutes } from './refunds.js';
import type { EventRequest } from './state.js';

const ROUTES: ApiRoute<unknown>[] = [...checkoutSessionRoutes, ...paymentIntentRoutes, ...refundRoutes, ...chargeRoutes, ...eventRoutes];
const BODY_LIMIT = 1024 * 1024;

export interface ApiOptions {
  /** When set, the only key accepted; otherwise any test-mode secret key (sk_test_…) is. */
  secretKey?: string;
}

/** Serves /v1: Stripe's authentication, form-encoded parameters, idempotency keys and JSON answers. */
export async function handleApi(fake: Fake, options: ApiOptions, req: IncomingMessage, res: ServerResponse, url: URL): Promise<void> {
  const requestId = newId('req');
  const headers: Record<string, string> = { 'request-id': requestId, 'stripe-version': header(req, 'stripe-version') ?? fake.apiVersion };
  try {
    const apiKey = authenticate(req, options);
    const { route, ids } = findRoute(req.method ?? 'GET', url.pathname);
    if (route.method === 'GET') {
      const body = execute(fake, route, parseForm(url.search.slice(1)), ids, { id: requestId, idempotency_key: null });
      return sendJson(res, 200, body, headers);
    }
    const key = header(req, 'idempotency-key');
    if (key === undefined) {
      const body = execute(fake, route, parseForm(await readFormText(req)), ids, { id: requestId, idempotency_key: null });
      return sendJson(res, 200, body, headers);
    }
    headers['idempotency-key'] = key;
    const answer = await runIdempotently(fake, route, ids, req, { apiKey, key, requestId, endpoint: `${route.method} ${url.pathname}` });
    if (answer.replayedFrom) Object.assign(headers, { 'idempotent-replayed': 'true', 'original-request': answer.replayedFrom });
    sendJsonText(res, answer.status, answer.body, headers);
  } catch (error) {
    if (error instanceof ApiError) return sendJson(res, error.status, { error: error.body }, headers);
    console.error(`stripe fake: ${req.method} ${url.pathname} failed: ${(error as Error).stack ?? String(error)}`);
    sendJson(res, 500, { error: errorBody('api_error', `The local Stripe fake failed on this request: ${(error as Error).message}`) }, headers);
  }
}

function authenticate(req: IncomingMessage, options: ApiOptions): string {
  const authorization = header(req, 'authorization');
  if (!authorization) {
    throw invalidRequest(
      "You did not provide an API key. You need to provide your API key in the Authorization header, using Bearer auth (e.g. 'Authorization: Bearer YOUR_SECRET_KEY').",
      { status: 401 },
    );
  }
  const key = keyFrom(authorization);
  const accepted = options.secretKey === undefined ? key !== null && /^sk_test_\w+$/.test(key) : key === options.secretKey;
  if (!key || !accepted) {
    const expectation = options.secretKey === undefined ? 'a test-mode secret key (sk_test_…)' : 'the secret key it was started with';
    throw invalidRequest(`Invalid API Key provided: ${redact(key ?? authorization)}. This local Stripe fake accepts ${expectation}.`, { status: 401 });
  }
  return key;
}

/** Bearer, as the SDK sends it, or Basic with the key as user name, as `curl -u sk_test_…:` sends it. */
function keyFrom(authorization: string): string | null {
  const bearer = /^Bearer\s+(\S+)$/i.exec(authorization);
  if (bearer) return bearer[1]!;
  const basic = /^Basic\s+(\S+)$/i.exec(authorization);
  if (basic) return Buffer.from(basic[1]!, 'base64').toString('utf8').split(':')[0] || null;
  return null;
}

function redact(key: string): string {
  return key.length <= 12 ? '*'.repeat(key.length) : `${key.slice(0, 8)}${'*'.repeat(key.length - 12)}${key.slice(-4)}`;
}

function findRoute(method: string, path: string): { route: ApiRoute<unknown>; ids: string[] } {
  for (const route of ROUTES) {
    const match = route.method === method ? route.path.exec(path) : null;
    const ids = match && decodePathIds(match.slice(1));
    if (ids) return { route, ids };
  }
  throw invalidRequest(`Unrecognized request URL (${method}: ${path}). The local Stripe fake serves the Checkout Session, PaymentIntent, Refund, Charge and Event endpoints Hitchbook uses.`, {
    status: 404,
  });
}

async function readFormText(req: IncomingMessage): Promise<string> {
  const text = await readBody(req, BODY_LIMIT);
  const type = mediaType(req);
  if (text !== '' && type !== 'application/x-www-form-urlencoded') {
    throw invalidRequest(
      `Stripe's API takes parameters form-encoded (Content-Type: application/x-www-form-urlencoded), with brackets for nesting such as metadata[invoiceId]=…; this request was ${type || 'sent without a Content-Type'}.`,
      { status: 400 },
    );
  }
  return text;
}

/** Validates every parameter, refusing any the endpoint did not read, before anything changes. */
function parseInput(route: ApiRoute<unknown>, form: FormHash): unknown {
  const params = new Params(form);
  const input = route.parse(params);
  params.rejectUnknown();
  return input;
}

function execute(fake: Fake, route: ApiRoute<unknown>, form: FormHash, ids: string[], request: EventRequest) {
  return route.run(fake, parseInput(route, form), { ids, request });
}

interface IdempotentCall {
  apiKey: string;
  key: string;
  requestId: string;
  endpoint: string;
}

/**
 * Stripe's idempotency: the key is claimed when the request arrives; parameters that fail validation
 * release it; once the endpoint has run, its answer (success or error) is saved and replayed for the same
 * parameters. The same key with other parameters, or while the first request is still arriving, is refused.
 */
async function runIdempotently(
  fake: Fake,
  route: ApiRoute<unknown>,
  ids: string[],
  req: IncomingMessage,
  call: IdempotentCall,
): Promise<{ status: number; body: string; replayedFrom?: string }> {
  if (call.key.length > MAX_KEY_LENGTH) {
    throw invalidRequest(`Idempotency-Key must be at most ${MAX_KEY_LENGTH} characters; this one has ${call.key.length}.`, { param: 'Idempotency-Key' });
  }
  const scope = `${call.apiKey}\n${call.key}`;
  const claim = fake.idempotency.claim(scope);
  if (claim.kind === 'in_flight') {
    req.resume();
    throw new ApiError(
      409,
      errorBody(
        'idempotency_error',
        `There is currently another in-progress request using this Idempotent Key (that probably means you submitted twice, and the other request is still going through): ${call.key}. Please try again later.`,
        { code: 'idempotency_key_in_use' },
      ),
    );
  }
  let text: string;
  try {
    text = await readFormText(req);
  } catch (error) {
    if (claim.kind === 'new') fake.idempotency.release(scope);
    throw error;
  }
  const fingerprint = fingerprintOf(text);
  if (claim.kind === 'saved') {
    if (claim.endpoint !== call.endpoint) {
      throw idempotencyMismatch(`Keys for idempotent requests can only be used for the same endpoint they were first used for: '${call.key}' was used for ${claim.endpoint}, not ${call.endpoint}.`);
    }
    if (claim.fingerprint !== fingerprint) {
      throw idempotencyMismatch(
        `Keys for idempotent requests can only be used with the same parameters they were first used with. Try using a key other than '${call.key}' if you meant to execute a different request.`,
      );
    }
    return { ...claim.response, replayedFrom: claim.response.requestId };
  }

  let input: unknown;
  try {
    input = parseInput(route, parseForm(text));
  } catch (error) {
    fake.idempotency.release(scope);
    throw error;
  }
  let answer: { status: number; body: string };
  try {
    answer = { status: 200, body: JSON.stringify(route.run(fake, input, { ids, request: { id: call.requestId, idempotency_key: call.key } })) };
  } catch (error) {
    if (!(error instanceof ApiError)) {
      fake.idempotency.release(scope);
      throw error;
    }
    answer = { status: error.status, body: JSON.stringify({ error: error.body }) };
  }
  fake.idempotency.save(scope, call.endpoint, fingerprint, { ...answer, requestId: call.requestId });
  return answer;
}

function idempotencyMismatch(message: string): ApiError {
  return new ApiError(400, errorBody('idempotency_error', message));
}
