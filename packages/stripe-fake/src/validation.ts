import { invalidRequest } from './api-error.js';
import type { Params } from './params.js';

/** A three-letter ISO code, lower-cased as Stripe stores it. */
export function readCurrency(p: Params, key: string): string | undefined {
  const raw = p.string(key);
  if (raw === undefined) return undefined;
  const code = raw.toLowerCase();
  if (!/^[a-z]{3}$/.test(code)) {
    throw invalidRequest(`Invalid currency: ${raw}. Give a three-letter ISO currency code such as usd, cad or eur.`, { param: p.nameOf(key) });
  }
  return code;
}

export function requiredCurrency(p: Params, key: string): string {
  const code = readCurrency(p, key);
  if (code === undefined) throw p.missingError(key);
  return code;
}

/** An absolute http(s) URL, kept exactly as given so placeholders such as {CHECKOUT_SESSION_ID} survive. */
export function readUrl(p: Params, key: string): string | undefined {
  const raw = p.string(key, { maxLength: 5000 });
  if (raw === undefined) return undefined;
  let url: URL | null = null;
  try {
    url = new URL(raw);
  } catch {
    // Reported just below with the parameter's name.
  }
  if (!url || (url.protocol !== 'http:' && url.protocol !== 'https:')) {
    throw invalidRequest(`Not a valid URL: ${p.nameOf(key)} must be an absolute http or https URL, got "${raw}".`, { param: p.nameOf(key), code: 'url_invalid' });
  }
  return raw;
}

export function readEmail(p: Params, key: string): string | undefined {
  const raw = p.string(key, { maxLength: 800 });
  if (raw === undefined) return undefined;
  if (!/^[^\s@]+@[^\s@]+\.[^\s@]+$/.test(raw)) throw invalidRequest(`Invalid email address: ${raw}`, { param: p.nameOf(key), code: 'email_invalid' });
  return raw;
}
