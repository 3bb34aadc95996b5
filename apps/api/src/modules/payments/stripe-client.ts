import Stripe from 'stripe';
import type { AppConfig } from '../../core/config.js';

export const STRIPE = Symbol('STRIPE');

/** Invoices are billed in US dollars; Stripe takes the code in lower case. */
export const CURRENCY = 'usd';

/**
 * The Stripe SDK, pointed at the configured host (the local fake in development and tests), or null
 * when card payments are not configured. The SDK never retries on its own: a checkout click is answered
 * or refused at once, and the idempotency key makes the payer's own retry safe.
 */
export function stripeClientOf(config: AppConfig): Stripe | null {
  const s = config.stripe;
  if (!s) return null;
  return new Stripe(s.secretKey, {
    ...(s.host ? { host: s.host } : {}),
    ...(s.port ? { port: s.port } : {}),
    protocol: s.protocol,
    maxNetworkRetries: 0,
    timeout: 10_000,
  });
}
