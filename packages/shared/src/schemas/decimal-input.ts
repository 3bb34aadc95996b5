import type { Decimal } from 'decimal.js';
import { z } from 'zod';
import { Dec, isDecimalString } from '../decimal.js';

export interface DecimalRules {
  // Lower bound; `above` makes it strict (a price of zero is as wrong as a negative one).
  atLeast?: number;
  above?: number;
  atMost?: number;
  wholeCents?: boolean;
  wholeNumber?: boolean;
}

function describeRules(rules: DecimalRules): string | undefined {
  const parts: string[] = [];
  if (rules.above !== undefined) parts.push(`above ${rules.above}`);
  if (rules.atLeast !== undefined) parts.push(`at least ${rules.atLeast}`);
  if (rules.atMost !== undefined) parts.push(`at most ${rules.atMost}`);
  if (rules.wholeCents) parts.push('whole cents');
  if (rules.wholeNumber) parts.push('a whole number');
  return parts.length > 0 ? parts.join(', ') : undefined;
}

function ruleBreach(value: Decimal, rules: DecimalRules): string | null {
  if (rules.above !== undefined && value.lte(rules.above)) return `Must be above ${rules.above}`;
  if (rules.atLeast !== undefined && value.lt(rules.atLeast)) return `Must be at least ${rules.atLeast}`;
  if (rules.atMost !== undefined && value.gt(rules.atMost)) return `Must be at most ${rules.atMost}`;
  if (rules.wholeCents && !value.times(100).isInteger()) return 'Use whole cents (at most 2 decimal places)';
  if (rules.wholeNumber && !value.isInteger()) return 'Must be a whole number';
  return null;
}

// A JSON number or a decimal string, as the API contract allows, parsed
// straight into an exact Decimal so no float ever touches the amount.
export function decimalInput(rules: DecimalRules = {}) {
  const description = describeRules(rules);
  const raw = z.union([z.number(), z.string()], {
    error: (issue) => (issue.input === undefined ? 'Required' : 'Enter a number, for example 1234.50'),
  });
  return (description ? raw.meta({ description: `Decimal, ${description}` }) : raw).transform((input, ctx): Decimal => {
    if (typeof input === 'number' ? !Number.isFinite(input) : !isDecimalString(input)) {
      ctx.issues.push({ code: 'custom', message: 'Enter a plain decimal number, for example 1234.50', input });
      return z.NEVER;
    }
    const value = new Dec(input);
    const breach = ruleBreach(value, rules);
    if (breach) ctx.issues.push({ code: 'custom', message: breach, input });
    return value;
  });
}

export function wholeNumberInput(rules: Omit<DecimalRules, 'wholeNumber' | 'wholeCents'> = {}) {
  return decimalInput({ ...rules, wholeNumber: true }).transform((value) => value.toNumber());
}
