import { Decimal } from 'decimal.js';
import { isCalendarDate } from '@hitchbook/shared/schemas/work-entries';

// Reading one CSV cell into a value, or the reason it cannot be one. Cells are text as typed in a
// spreadsheet: dates in ISO or US order, numbers with thousands separators, money with a dollar sign.

export type Cell<T> = { ok: true; value: T } | { ok: false; reason: string };

const ok = <T>(value: T): Cell<T> => ({ ok: true, value });
const fail = <T>(reason: string): Cell<T> => ({ ok: false, reason });

const US_DATE = /^(\d{1,2})\/(\d{1,2})\/(\d{4})$/;

/** YYYY-MM-DD, or M/D/YYYY as US spreadsheets write it. */
export function dateCell(text: string): Cell<string> {
  const us = US_DATE.exec(text);
  const iso = us ? `${us[3]}-${us[1]!.padStart(2, '0')}-${us[2]!.padStart(2, '0')}` : text;
  return isCalendarDate(iso) ? ok(iso) : fail('Enter a real date as YYYY-MM-DD or M/D/YYYY.');
}

const PLAIN = /^\d+(?:\.\d+)?$/;
const GROUPED = /^\d{1,3}(?:,\d{3})+(?:\.\d+)?$/;

export interface NumberRules {
  min: number;
  max: number;
  decimals: number;
  /** A zero is as wrong as a negative (gallons on a fuel ticket). */
  positive?: boolean;
  money?: boolean;
}

/** A non-negative decimal within the rules; thousands commas are allowed, and a $ for money. */
export function numberCell(text: string, rules: NumberRules): Cell<Decimal> {
  const bare = rules.money ? text.replace(/^\$\s*/, '') : text;
  if (!PLAIN.test(bare) && !GROUPED.test(bare)) return fail(rules.money ? 'Enter an amount such as 312.40.' : 'Enter a number such as 12.5.');
  const value = new Decimal(bare.replace(/,/g, ''));
  if (rules.positive && value.lte(0)) return fail('Must be more than 0.');
  if (value.lt(rules.min)) return fail(`Must be at least ${rules.min}.`);
  if (value.gt(rules.max)) return fail(`Must be at most ${rules.max}.`);
  if (value.decimalPlaces() > rules.decimals) return fail(rules.money ? 'Use whole cents.' : `At most ${rules.decimals} decimal places.`);
  return ok(value);
}

export function singleLineCell(text: string, max: number): Cell<string> {
  if (/[\r\n]/.test(text)) return fail('Must be a single line.');
  if (text.length > max) return fail(`At most ${max} characters.`);
  return ok(text);
}

/** Case-insensitive lookup of the operation's own rows by any of their names. */
export class NameIndex<T> {
  private readonly byName = new Map<string, T[]>();

  constructor(
    items: readonly T[],
    names: (item: T) => Array<string | null>,
    private readonly what: string,
  ) {
    for (const item of items) {
      const keys = new Set(names(item).filter((n): n is string => !!n).map(normalName));
      for (const key of keys) this.byName.set(key, [...(this.byName.get(key) ?? []), item]);
    }
  }

  find(text: string): Cell<T> {
    const found = this.byName.get(normalName(text)) ?? [];
    if (found.length === 1) return ok(found[0]!);
    if (found.length > 1) return fail(`${found.length} ${this.what}s are called "${text}"; rename one so the file can say which.`);
    return fail(`No ${this.what} called "${text}" in this operation.`);
  }
}

function normalName(name: string): string {
  return name.trim().replace(/\s+/g, ' ').toLowerCase();
}
