import { invalidRequest } from './api-error.js';
import type { Params } from './params.js';

export type ObjectType = 'checkout.session' | 'payment_intent' | 'charge' | 'refund' | 'event';

/** Which fields of each object `expand[]` may turn from an id into the object, and what that object is. */
const EXPANDABLE: Record<ObjectType, Record<string, ObjectType | 'list'>> = {
  'checkout.session': { payment_intent: 'payment_intent', line_items: 'list' },
  payment_intent: { latest_charge: 'charge' },
  charge: { payment_intent: 'payment_intent' },
  refund: { charge: 'charge', payment_intent: 'payment_intent' },
  event: {},
};

/** Refuses an expansion path the object does not have, with Stripe's message. */
function checkExpand(type: ObjectType, paths: string[]): void {
  for (const path of paths) {
    let current: ObjectType | 'list' = type;
    for (const field of path.split('.')) {
      const next: ObjectType | 'list' | undefined = current === 'list' ? undefined : EXPANDABLE[current][field];
      if (next === undefined) throw invalidRequest(`This property cannot be expanded (${field}).`, { param: 'expand' });
      current = next;
    }
  }
}

/** Reads `expand[]` and refuses what `type` cannot expand. */
export function readExpand(p: Params, type: ObjectType): string[] {
  const expand = p.expand();
  checkExpand(type, expand);
  return expand;
}

/** The paths below `field` when it is to be expanded (`[]` for the field alone), or null when it stays an id. */
export function expansionOf(paths: string[], field: string): string[] | null {
  if (!paths.some((p) => p === field || p.startsWith(`${field}.`))) return null;
  return paths.filter((p) => p.startsWith(`${field}.`)).map((p) => p.slice(field.length + 1));
}
