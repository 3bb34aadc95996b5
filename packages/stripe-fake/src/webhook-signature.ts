import { createHmac } from 'node:crypto';

/**
 * Stripe's `Stripe-Signature` header: `t=<unix seconds>,v1=<hex HMAC-SHA256 of "<t>.<payload>" keyed by the endpoint secret>`.
 * The whole secret, `whsec_` prefix included, is the key, as in Stripe's own verification code.
 */
export function signatureHeader(payload: string, secret: string, timestamp: number): string {
  const signature = createHmac('sha256', secret).update(`${timestamp}.${payload}`, 'utf8').digest('hex');
  return `t=${timestamp},v1=${signature}`;
}
