import { createHash } from 'node:crypto';
import { escapeHtml } from './html.js';
import { formatAmount } from './money.js';
import type { CheckoutSessionRecord } from './state.js';

const STYLE = `
:root { color-scheme: light; font-family: system-ui, -apple-system, "Segoe UI", sans-serif; color: #1a1f36; background: #f6f8fa; }
body { margin: 0; }
main { max-width: 28rem; margin: 2rem auto; padding: 1.5rem; background: #fff; border-radius: 8px; box-shadow: 0 1px 4px rgba(0,0,0,.12); }
.badge { display: inline-block; margin: 0 0 1rem; padding: .15rem .5rem; border-radius: 4px; background: #ffde92; color: #5a3a00; font-size: .75rem; font-weight: 600; text-transform: uppercase; }
h1 { margin: 0 0 .25rem; font-size: 1.1rem; font-weight: 500; color: #4f566b; }
.total { margin: 0 0 1rem; font-size: 2rem; font-weight: 600; }
.items { list-style: none; margin: 0 0 1.5rem; padding: 0; border-top: 1px solid #e3e8ee; }
.items li { display: flex; justify-content: space-between; gap: 1rem; padding: .5rem 0; border-bottom: 1px solid #e3e8ee; }
.items small { display: block; color: #697386; }
form { display: grid; gap: .75rem; }
label { display: grid; gap: .25rem; font-size: .85rem; color: #4f566b; }
input { font: inherit; padding: .55rem .65rem; border: 1px solid #cfd7df; border-radius: 6px; }
input:focus { outline: 2px solid #635bff; outline-offset: 0; }
.row { display: grid; grid-template-columns: 1fr 1fr; gap: .75rem; }
button { font: inherit; font-weight: 600; padding: .7rem; border: 0; border-radius: 6px; background: #635bff; color: #fff; cursor: pointer; }
.error { margin: 0; padding: .6rem .75rem; border-radius: 6px; background: #fde8e8; color: #a41c1c; }
.cancel { display: inline-block; margin-top: 1rem; color: #635bff; }
details { margin-top: 1.5rem; font-size: .85rem; color: #4f566b; }
code { font-size: .85rem; }
`;

const STYLE_HASH = `'sha256-${createHash('sha256').update(STYLE).digest('base64')}'`;

/**
 * No scripts, no outside resources, only the page's own stylesheet; forms may go to the page itself and,
 * because browsers check redirects after a form post too, to the origin of the success URL.
 */
export function pagePolicy(formTargets: string[]): string {
  const formAction = formTargets.length > 0 ? formTargets.join(' ') : "'none'";
  return `default-src 'none'; style-src ${STYLE_HASH}; form-action ${formAction}; frame-ancestors 'none'; base-uri 'none'`;
}

const TEST_CARDS: [string, string][] = [
  ['4242 4242 4242 4242', 'succeeds'],
  ['4000 0000 0000 0002', 'declined'],
  ['4000 0000 0000 9995', 'insufficient funds'],
  ['4000 0000 0000 0069', 'expired card'],
  ['4000 0000 0000 0127', 'incorrect CVC'],
];

function page(title: string, body: string): string {
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(title)}</title>
<style>${STYLE}</style>
</head>
<body>
<main>
<p class="badge">Test mode · local Stripe checkout</p>
${body}
</main>
</body>
</html>
`;
}

export interface FormState {
  error?: string;
  email?: string;
}

export function renderCheckoutPage(s: CheckoutSessionRecord, state: FormState = {}): string {
  const total = formatAmount(s.amountTotal, s.currency);
  const items = s.lineItems
    .map((item) => {
      const detail = [item.description, item.quantity > 1 ? `${item.quantity} × ${formatAmount(item.unitAmount, item.currency)}` : null].filter(Boolean).join(' · ');
      return `<li><span>${escapeHtml(item.name)}${detail ? `<small>${escapeHtml(detail)}</small>` : ''}</span><span>${formatAmount(item.unitAmount * item.quantity, item.currency)}</span></li>`;
    })
    .join('\n');
  const email = s.customerEmail ?? state.email ?? '';
  const body = `<h1>${escapeHtml(s.paymentIntentData.description ?? 'Amount due')}</h1>
<p class="total" data-testid="amount">${total}</p>
<ul class="items">
${items}
</ul>
<form method="post" action="/checkout/${encodeURIComponent(s.id)}">
${state.error ? `<p class="error" role="alert">${escapeHtml(state.error)}</p>` : ''}
<label>Email <input name="email" type="email" autocomplete="email" required value="${escapeHtml(email)}"${s.customerEmail ? ' readonly' : ''}></label>
<label>Card number <input name="card_number" inputmode="numeric" autocomplete="cc-number" placeholder="1234 1234 1234 1234" required></label>
<div class="row">
<label>Expiry <input name="expiry" autocomplete="cc-exp" placeholder="MM / YY" required></label>
<label>CVC <input name="cvc" inputmode="numeric" autocomplete="cc-csc" placeholder="CVC" required></label>
</div>
<button type="submit">Pay ${total}</button>
</form>
${s.cancelUrl ? `<a class="cancel" href="${escapeHtml(s.cancelUrl)}">Cancel and go back</a>` : ''}
<details>
<summary>Test cards</summary>
<p>Any future expiry date and any CVC (four digits for American Express).</p>
<ul>
${TEST_CARDS.map(([number, outcome]) => `<li><code>${number}</code> ${outcome}</li>`).join('\n')}
</ul>
</details>`;
  return page(`Pay ${total}`, body);
}

/** What a payer sees at the URL of a session that can no longer be paid. */
export function renderClosedPage(s: CheckoutSessionRecord, successRedirect: string): string {
  if (s.status === 'complete') {
    return page('Payment complete', `<h1>Payment complete</h1>
<p class="total">${formatAmount(s.amountTotal, s.currency)}</p>
<p>This checkout session has already been paid.</p>
<a class="cancel" href="${escapeHtml(successRedirect)}">Continue</a>`);
  }
  return page('Checkout session expired', `<h1>This checkout session has expired</h1>
<p>Ask for a new payment link to pay.</p>
${s.cancelUrl ? `<a class="cancel" href="${escapeHtml(s.cancelUrl)}">Go back</a>` : ''}`);
}

export function renderMissingPage(id: string): string {
  return page('Checkout session not found', `<h1>Checkout session not found</h1>
<p>There is no checkout session <code>${escapeHtml(id)}</code>. It may have been cleared when the local Stripe fake restarted.</p>`);
}
