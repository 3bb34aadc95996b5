import type { IncomingMessage, ServerResponse } from 'node:http';
import { checkTypedCard, parseExpiry } from './card-entry.js';
import { payCheckoutSession, successRedirect } from './checkout-sessions.js';
import { pagePolicy, renderCheckoutPage, renderClosedPage, renderMissingPage } from './checkout-page.js';
import type { Fake } from './fake.js';
import { decodePathIds, readBody, sendHtml } from './http-util.js';
import { isCardFailure } from './test-cards.js';
import type { CheckoutSessionRecord } from './state.js';

const FORM_LIMIT = 16 * 1024;
/** A payer on the page is not an API request, so events it causes carry no request id, as on Stripe. */
const FROM_PAYER = { id: null, idempotency_key: null };

/** The payer's side of Checkout: GET shows the page at the session's `url`, POST is its Pay button. */
export async function handleCheckoutPage(fake: Fake, req: IncomingMessage, res: ServerResponse, url: URL): Promise<boolean> {
  const match = /^\/checkout\/([^/]+)$/.exec(url.pathname);
  const id = match ? decodePathIds([match[1]!])?.[0] : undefined;
  if (id === undefined || (req.method !== 'GET' && req.method !== 'POST')) return false;
  const session = fake.state.sessions.get(id);
  if (!session) {
    sendHtml(res, 404, renderMissingPage(id), pagePolicy([]));
    return true;
  }
  if (session.status !== 'open') {
    if (req.method === 'POST') req.resume();
    sendHtml(res, 410, renderClosedPage(session, successRedirect(session)), pagePolicy([]));
    return true;
  }
  if (req.method === 'GET') {
    sendHtml(res, 200, renderCheckoutPage(session), openPagePolicy(session));
    return true;
  }
  await pay(fake, session, req, res);
  return true;
}

function openPagePolicy(s: CheckoutSessionRecord): string {
  return pagePolicy(["'self'", new URL(s.successUrl).origin]);
}

async function pay(fake: Fake, session: CheckoutSessionRecord, req: IncomingMessage, res: ServerResponse): Promise<void> {
  const form = new URLSearchParams(await readBody(req, FORM_LIMIT));
  const email = form.get('email')?.trim() || null;
  const typed = checkTypedCard({ number: form.get('card_number') ?? '', expiry: parseExpiry(form.get('expiry') ?? ''), cvc: form.get('cvc') ?? '' });
  const showError = (message: string) =>
    sendHtml(res, 402, renderCheckoutPage(session, { error: message, email: email ?? undefined }), openPagePolicy(session));
  if (isCardFailure(typed)) return showError(typed.message);
  if (!email && !session.customerEmail) return showError('Enter your email address.');
  const declined = payCheckoutSession(fake, session, { card: typed.card, expiry: typed.expiry, email }, FROM_PAYER);
  if (declined) return showError(declined.message);
  // 303 makes the browser fetch the success page with GET, so reloading it does not post the card again.
  res.writeHead(303, { location: successRedirect(session), 'cache-control': 'no-store' });
  res.end();
}
