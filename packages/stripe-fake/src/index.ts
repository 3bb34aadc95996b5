import { randomBytes } from 'node:crypto';
import { createServer, type IncomingMessage, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import { handleApi } from './api-handler.js';
import { ApiError, invalidRequest } from './api-error.js';
import { handleControl } from './control-api.js';
import { Fake } from './fake.js';
import { handleCheckoutPage } from './hosted-checkout.js';
import { sendJson } from './http-util.js';
import { WebhookSender } from './webhook-sender.js';

export type { DeliveryAttempt, DeliveryStatus } from './webhook-sender.js';

export interface StripeFakeOptions {
  host?: string;
  /** 0 picks a free port. */
  port?: number;
  /** Where events are POSTed; without it they are only kept (and can be sent once an endpoint is set through /_fake). */
  webhookUrl?: string;
  /** The endpoint's signing secret; a random whsec_… one when not given. */
  webhookSecret?: string;
  /** The fake's address as browsers reach it, for checkout page URLs; http://host:port when not given. */
  publicUrl?: string;
  /** Milliseconds to wait before each retry of a refused webhook; its length is the number of retries. */
  retrySchedule?: number[];
  /** How long an endpoint has to answer one webhook attempt. */
  webhookTimeoutMs?: number;
  /** When set, the only API key accepted; otherwise any sk_test_… key is. */
  secretKey?: string;
}

export interface RunningStripeFake {
  port: number;
  /** The base URL of the API, the checkout pages and the /_fake control API. */
  url: string;
  webhookSecret: string;
  stop(): Promise<void>;
}

/** Five attempts over half a minute: quick enough for a test run, spaced like Stripe's back-off. */
export const DEFAULT_RETRY_SCHEDULE = [2_000, 4_000, 8_000, 16_000];

export async function startStripeFake({
  host = '127.0.0.1',
  port = 0,
  webhookUrl,
  webhookSecret = `whsec_${randomBytes(24).toString('hex')}`,
  publicUrl,
  retrySchedule = DEFAULT_RETRY_SCHEDULE,
  webhookTimeoutMs = 10_000,
  secretKey,
}: StripeFakeOptions = {}): Promise<RunningStripeFake> {
  checkOptions({ webhookUrl, webhookSecret, retrySchedule, webhookTimeoutMs, publicUrl });
  const webhooks = new WebhookSender(webhookUrl ? { url: webhookUrl, secret: webhookSecret } : null, retrySchedule, webhookTimeoutMs);
  const fake = new Fake(webhooks, webhookSecret);
  const server = createServer((req, res) => {
    dispatch(fake, secretKey, req, res).catch((error: unknown) => {
      if (error instanceof ApiError && !res.headersSent) return sendJson(res, error.status, { error: error.body });
      console.error(`stripe fake: ${req.method} ${req.url} failed: ${(error as Error).stack ?? String(error)}`);
      if (res.headersSent) res.destroy();
      else sendJson(res, 500, { error: { type: 'api_error', message: `The local Stripe fake failed on this request: ${(error as Error).message}` } });
    });
  });
  const boundPort = await listen(server, host, port);
  const url = (publicUrl ?? `http://${urlHost(host)}:${boundPort}`).replace(/\/+$/, '');
  fake.baseUrl = url;
  return {
    port: boundPort,
    url,
    webhookSecret,
    async stop() {
      webhooks.reset();
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
    },
  };
}

async function dispatch(fake: Fake, secretKey: string | undefined, req: IncomingMessage, res: ServerResponse): Promise<void> {
  const url = new URL(req.url ?? '/', 'http://stripe-fake.invalid');
  if (url.pathname.startsWith('/v1/')) return handleApi(fake, { secretKey }, req, res, url);
  if (await handleCheckoutPage(fake, req, res, url)) return;
  if (await handleControl(fake, req, res, url)) return;
  req.resume();
  if (url.pathname === '/' && req.method === 'GET') {
    return sendJson(res, 200, { name: 'Hitchbook local Stripe fake', api: `${fake.baseUrl}/v1`, control: `${fake.baseUrl}/_fake` });
  }
  throw invalidRequest(`Nothing at ${req.method} ${url.pathname}. The fake serves /v1 (Stripe's API), /checkout/:id (payment pages) and /_fake (its control API).`, { status: 404 });
}

function checkOptions(o: Pick<StripeFakeOptions, 'webhookUrl' | 'webhookSecret' | 'retrySchedule' | 'webhookTimeoutMs' | 'publicUrl'>): void {
  for (const [name, value] of [['webhookUrl', o.webhookUrl], ['publicUrl', o.publicUrl]] as const) {
    if (value !== undefined && !/^https?:\/\/[^\s]+$/.test(value)) throw new Error(`Stripe fake: ${name} must be an http or https URL, got "${value}"`);
  }
  if (!o.webhookSecret) throw new Error('Stripe fake: webhookSecret must not be empty');
  if (!o.retrySchedule!.every((ms) => Number.isInteger(ms) && ms >= 0)) {
    throw new Error(`Stripe fake: retrySchedule must be a list of whole milliseconds, got ${JSON.stringify(o.retrySchedule)}`);
  }
  if (!(Number.isInteger(o.webhookTimeoutMs) && o.webhookTimeoutMs! > 0)) throw new Error(`Stripe fake: webhookTimeoutMs must be a positive whole number, got ${o.webhookTimeoutMs}`);
}

/** The host part of a URL for the bound address; a wildcard address is reached through loopback. */
function urlHost(host: string): string {
  if (host === '0.0.0.0' || host === '::') return '127.0.0.1';
  return host.includes(':') ? `[${host}]` : host;
}

function listen(server: ReturnType<typeof createServer>, host: string, port: number): Promise<number> {
  return new Promise((resolve, reject) => {
    const onError = (error: NodeJS.ErrnoException) => {
      const reason =
        error.code === 'EADDRINUSE' ? `port ${port} on ${host} is already in use` : error.code === 'EACCES' ? `no permission to listen on ${host}:${port}` : error.message;
      reject(new Error(`Stripe fake could not start: ${reason}`));
    };
    server.once('error', onError);
    server.listen(port, host, () => {
      server.off('error', onError);
      resolve((server.address() as AddressInfo).port);
    });
  });
}
