import { invalidRequest } from './api-error.js';

/** A decoded request parameter: Stripe's bracket notation nests hashes (`a[b]`) and lists (`a[0]`, `a[]`). */
export type FormValue = string | FormValue[] | FormHash;
export interface FormHash {
  [key: string]: FormValue;
}

const KEY = /^([^[\]]+)((?:\[[^[\]]*\])*)$/;

/**
 * Decodes `application/x-www-form-urlencoded` text the way Stripe reads it:
 * `line_items[0][price_data][unit_amount]=1000` becomes `{ line_items: [{ price_data: { unit_amount: '1000' } }] }`.
 * Every value stays a string; the endpoint decides what it must be.
 */
export function parseForm(text: string): FormHash {
  // Prototype-less hashes, so a key such as `__proto__` is stored as a parameter and changes no object's prototype.
  const root: FormHash = Object.create(null);
  for (const [key, value] of new URLSearchParams(text)) {
    const match = KEY.exec(key);
    if (!match) throw invalidRequest(`Invalid parameter name: ${key}`, { param: key });
    const segments = [match[1]!, ...[...match[2]!.matchAll(/\[([^[\]]*)\]/g)].map((m) => m[1]!)];
    assign(root, segments, value, key);
  }
  return listify(root) as FormHash;
}

/** Builds nested hashes; `[]` appends, so it is stored under the next free index. */
function assign(target: FormHash, segments: string[], value: string, fullKey: string): void {
  let node = target;
  segments.forEach((raw, i) => {
    const segment = raw === '' ? String(Object.keys(node).length) : raw;
    const last = i === segments.length - 1;
    const existing = node[segment];
    if (last) {
      if (existing !== undefined) throw invalidRequest(`The parameter ${fullKey} was given more than once.`, { param: fullKey });
      node[segment] = value;
      return;
    }
    if (typeof existing === 'string') {
      throw invalidRequest(`The parameter ${bracketName(segments.slice(0, i + 1))} is given both as a value and as a hash.`, { param: fullKey });
    }
    const child = (existing as FormHash | undefined) ?? Object.create(null);
    node[segment] = child;
    node = child;
  });
}

function bracketName([first, ...rest]: string[]): string {
  return `${first}${rest.map((s) => `[${s}]`).join('')}`;
}

/** A hash whose keys are exactly 0..n-1 is a list, as the SDK sends arrays (`expand[0]`, `line_items[1]`). */
function listify(value: FormValue): FormValue {
  if (typeof value === 'string' || Array.isArray(value)) return value;
  const keys = Object.keys(value);
  const entries = keys.map((k) => [k, listify(value[k]!)] as const);
  const isList = keys.length > 0 && keys.every((k, i) => k === String(i));
  if (isList) return entries.map(([, v]) => v);
  return Object.fromEntries(entries);
}
