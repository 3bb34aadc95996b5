import { createServer, type IncomingHttpHeaders } from 'node:http';
import type { AddressInfo } from 'node:net';
import Stripe from 'stripe';
import { afterEach } from 'vitest';
import { startStripeFake, type RunningStripeFake, type StripeFakeOptions } from '../index.js';

export const TEST_KEY = 'sk_test_hitchbook_tests';
export const WEBHOOK_SECRET = 'whsec_hitchbook_tests_0123456789abcdef';

const cleanups: (() => Promise<void>)[] = [];

afterEach(async () => {
  await Promise.all(cleanups.splice(0).map((stop) => stop()));
});

export async function startFake(options: StripeFakeOptions = {}): Promise<RunningStripeFake> {
  const fake = await startStripeFake({ webhookSecret: WEBHOOK_SECRET, retrySchedule: [50, 50, 50, 50], ...options });
  cleanups.push(() => fake.stop());
  return fake;
}

/** The official SDK pointed at the fake, exactly as the API configures it. */
export function sdkFor(fake: RunningStripeFake, key = TEST_KEY): Stripe {
  return new Stripe(key, { host: '127.0.0.1', port: fake.port, protocol: 'http', maxNetworkRetries: 0 });
}

export interface ReceivedWebhook {
  rawBody: string;
  headers: IncomingHttpHeaders;
  status: number;
}

/**
 * A webhook endpoint that keeps the raw bytes of every delivery and answers with the given statuses
 * in turn, then 200 for the rest.
 */
export async function startReceiver(answers: number[] = []) {
  const received: ReceivedWebhook[] = [];
  const script = [...answers];
  const server = createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => chunks.push(c));
    req.on('end', () => {
      const status = script.shift() ?? 200;
      received.push({ rawBody: Buffer.concat(chunks).toString('utf8'), headers: req.headers, status });
      res.writeHead(status, { 'content-type': 'text/plain' }).end(status === 200 ? 'ok' : 'endpoint refused it');
    });
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}/api/payments/stripe-webhook`;
  cleanups.push(
    () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  );
  return {
    url,
    received,
    /** The parsed events received so far of this type. */
    ofType: (type: string) => received.filter((r) => JSON.parse(r.rawBody).type === type),
  };
}

/** Polls until `check` returns a value that is not undefined, or fails after `timeoutMs`. */
export async function eventually<T>(check: () => T | undefined | Promise<T | undefined>, timeoutMs = 3000): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await check();
    if (value !== undefined) return value;
    if (Date.now() > deadline) throw new Error(`condition not met within ${timeoutMs} ms`);
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
}

/** Calls the /_fake control API with JSON and returns its status and parsed body. */
export async function control(fake: RunningStripeFake, method: string, path: string, body?: unknown): Promise<{ status: number; body: any }> {
  const res = await fetch(`${fake.url}/_fake${path}`, {
    method,
    headers: method === 'GET' ? {} : { 'content-type': 'application/json' },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  return { status: res.status, body: await res.json() };
}

/** A Checkout Session for one Hitchbook invoice, as the API creates it. */
export function createInvoiceSession(stripe: Stripe, overrides: Partial<Stripe.Checkout.SessionCreateParams> = {}, options?: Stripe.RequestOptions) {
  return stripe.checkout.sessions.create(
    {
      mode: 'payment',
      currency: 'usd',
      line_items: [
        {
          quantity: 1,
          price_data: { currency: 'usd', unit_amount: 124050, product_data: { name: 'Invoice 2026-014', description: 'Combining, 40 ac at Miller north quarter' } },
        },
      ],
      success_url: 'http://localhost:3000/invoices/inv_14/paid?session={CHECKOUT_SESSION_ID}',
      cancel_url: 'http://localhost:3000/invoices/inv_14',
      client_reference_id: 'inv_14',
      customer_email: 'customer@hitchbook.test',
      metadata: { invoiceId: 'inv_14', operationId: 'op_7' },
      payment_intent_data: { metadata: { invoiceId: 'inv_14' }, description: 'Invoice 2026-014' },
      ...overrides,
    },
    options,
  );
}

export function payWithCard(fake: RunningStripeFake, sessionId: string, card_number: string, extra: Record<string, unknown> = {}) {
  return control(fake, 'POST', `/checkout/sessions/${sessionId}/pay`, { card_number, ...extra });
}

/** The `error` member of a Stripe-shaped error answer. */
export async function errorOf(res: Response): Promise<Record<string, unknown>> {
  return ((await res.json()) as { error: Record<string, unknown> }).error;
}
