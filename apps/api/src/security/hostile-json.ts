import fc from 'fast-check';
import type { z } from 'zod';

/**
 * Request bodies for fuzzing, driven by a route's own zod schema: values that pass the schema (so the
 * service and the database are reached), the same with one field made hostile, or a hostile body in
 * place of the whole thing. Bodies are JSON text, so `__proto__` keys arrive exactly as an attacker
 * would send them.
 */

const MAX_DEPTH = 4;

/** Values that are wrong for almost any field and have broken JSON APIs before. */
const hostileLeaf: fc.Arbitrary<unknown> = fc.oneof(
  fc.constantFrom<unknown>(
    null,
    true,
    0,
    -0,
    -1,
    1e308,
    -1e308,
    2 ** 53 + 1,
    0.1 + 0.2,
    '',
    ' ',
    'NaN',
    'Infinity',
    '-Infinity',
    '1e309',
    '-0',
    '0x10',
    '99999999999999999999.99',
    '-99999999999999999999',
    '1.0000000000000000001',
    '00000000-0000-0000-0000-000000000000',
    '9999-12-31',
    '0000-01-01',
    '2025-02-30',
    '2025-06-01T25:61:00Z',
    "' OR 1=1 --",
    "'); drop table work_entries; --",
    '%00',
    'a\u0000b',
    '\u0000',
    '\ud800',
    '\u202e\u200f\ufeff',
    '𝕳𝖎𝖙𝖈𝖍 🚜🌾 ﷽',
    'Name\r\nBcc: someone@evil.example',
    '=HYPERLINK("http://evil.example")',
    '../../../../etc/passwd',
    '<script>alert(1)</script>',
    [],
    {},
    [[[]]],
  ),
  fc.string({ unit: 'binary', maxLength: 40 }),
  fc.string({ unit: 'grapheme', maxLength: 40 }),
  fc.integer({ min: 1_000, max: 12_000 }).map((n) => '\u00e9\u0301'.repeat(n)),
  fc.double(),
  fc.bigInt({ min: -(10n ** 30n), max: 10n ** 30n }).map((b) => Number(b)),
);

/** A whole body that is no object of the route's shape at all. */
const hostileBody: fc.Arbitrary<string> = fc.oneof(
  fc.jsonValue({ maxDepth: 3 }).map((v) => JSON.stringify(v)),
  hostileLeaf.map((v) => JSON.stringify(v) ?? 'null'),
  fc.integer({ min: 200, max: 20_000 }).map((n) => `${'['.repeat(n)}${']'.repeat(n)}`),
  fc.integer({ min: 200, max: 5_000 }).map((n) => `${'{"a":'.repeat(n)}1${'}'.repeat(n)}`),
  fc.constantFrom(
    '{"__proto__":{"polluted":"yes"}}',
    '{"constructor":{"prototype":{"polluted":"yes"}}}',
    '{"__proto__":{"toString":"x","valueOf":1,"hasOwnProperty":null}}',
    '{"a":1,"a":{"__proto__":{"polluted":"yes"}}}',
  ),
);

type Def = { type: string; [k: string]: unknown };
interface Check {
  _zod: { def: { check: string; format?: string; pattern?: RegExp; minimum?: number | bigint; maximum?: number | bigint; value?: number; inclusive?: boolean } };
}

function defOf(schema: unknown): Def {
  return (schema as { _zod: { def: Def } })._zod.def;
}

function checksOf(def: Def): Check['_zod']['def'][] {
  return ((def.checks as Check[] | undefined) ?? []).map((c) => c._zod.def);
}

export interface FuzzContext {
  /** Ids of real rows in the fuzzed operation, offered for every uuid field. */
  ids: readonly string[];
}

function stringArb(def: Def, ctx: FuzzContext): fc.Arbitrary<unknown> {
  const checks = checksOf(def);
  if (def.format) checks.push(def as never);
  const format = checks.find((c) => c.check === 'string_format')?.format;
  if (format === 'uuid' || format === 'guid') return ctx.ids.length > 0 ? fc.oneof(fc.constantFrom(...ctx.ids), fc.uuid()) : fc.uuid();
  if (format === 'email') return fc.emailAddress();
  const min = Number(checks.find((c) => c.check === 'min_length')?.minimum ?? 0);
  const max = Number(checks.find((c) => c.check === 'max_length')?.maximum ?? 60);
  const pattern = checks.find((c) => c.pattern)?.pattern;
  if (pattern) {
    try {
      return fc.stringMatching(pattern).filter((s) => s.length >= min && s.length <= max);
    } catch {
      // A pattern fast-check cannot invert: plain strings still reach the refusal paths.
    }
  }
  return fc.oneof(
    { weight: 3, arbitrary: plausibleString(ctx) },
    { weight: 1, arbitrary: fc.string({ minLength: min, maxLength: Math.min(max, min + 60) }) },
  );
}

/**
 * Many fields are strings checked by a refinement (decimals, dates, e-mail addresses) that no generator
 * can invert; the shapes such fields take in this domain get most bodies past validation.
 */
function plausibleString(ctx: FuzzContext): fc.Arbitrary<string> {
  return fc.oneof(
    fc.constantFrom('0', '1', '2.5', '12.50', '100', '250.000', '0.01', '99.9999', '-3.25', '1000000', 'Home quarter', 'Tamarack Road', 'neighbour', 'someone@example.test'),
    fc.integer({ min: 0, max: 99_999 }).map((n) => (n / 100).toFixed(2)),
    fc.date({ min: new Date('2020-01-01T00:00:00Z'), max: new Date('2030-12-31T00:00:00Z'), noInvalidDate: true }).chain((d) =>
      fc.constantFrom(d.toISOString().slice(0, 10), d.toISOString()),
    ),
    ctx.ids.length > 0 ? fc.constantFrom(...ctx.ids) : fc.uuid(),
  );
}

function numberArb(def: Def): fc.Arbitrary<unknown> {
  const checks = checksOf(def);
  const int = checks.some((c) => c.format === 'safeint' || c.format === 'int32' || c.format === 'uint32') || def.format === 'safeint';
  const lo = checks.find((c) => c.check === 'greater_than')?.value;
  const hi = checks.find((c) => c.check === 'less_than')?.value;
  const min = typeof lo === 'number' ? lo : -1e6;
  const max = typeof hi === 'number' ? hi : 1e6;
  return int
    ? fc.integer({ min: Math.max(Math.ceil(min), -(2 ** 31)), max: Math.min(Math.floor(max), 2 ** 31) })
    : fc.double({ min, max, noNaN: true });
}

/** Values that pass `schema`, found by sampling the generator and keeping what the schema accepts. */
export function validValue(schema: unknown, ctx: FuzzContext, depth = 0): fc.Arbitrary<unknown> {
  const parse = (schema as z.ZodType).safeParse?.bind(schema);
  const raw = rawValue(schema, ctx, depth);
  if (!parse) return raw;
  const seen = new Set<string>();
  const pool: unknown[] = [];
  for (const v of fc.sample(raw, { numRuns: 150, seed: 1 })) {
    const key = JSON.stringify(v) ?? 'undefined';
    if (!seen.has(key) && parse(v === undefined ? v : JSON.parse(key)).success) {
      seen.add(key);
      pool.push(v);
    }
  }
  return pool.length > 0 ? fc.constantFrom(...pool) : raw;
}

function rawValue(schema: unknown, ctx: FuzzContext, depth: number): fc.Arbitrary<unknown> {
  const def = defOf(schema);
  const next = (s: unknown) => validValue(s, ctx, depth + 1);
  if (depth > MAX_DEPTH) return hostileLeaf;
  switch (def.type) {
    case 'string':
      return stringArb(def, ctx);
    case 'number':
      return numberArb(def);
    case 'int':
      return fc.integer();
    case 'bigint':
      return fc.bigInt().map(String);
    case 'boolean':
      return fc.boolean();
    case 'date':
      return fc.date({ noInvalidDate: true }).map((d) => d.toISOString());
    case 'null':
      return fc.constant(null);
    case 'enum':
      return fc.constantFrom(...Object.values(def.entries as Record<string, unknown>));
    case 'literal':
      return fc.constantFrom(...(def.values as unknown[]));
    case 'optional':
      return fc.option(next(def.innerType), { nil: undefined });
    case 'nullable':
      return fc.option(next(def.innerType), { nil: null });
    case 'default':
    case 'prefault':
    case 'catch':
    case 'readonly':
    case 'nonoptional':
    case 'success':
      return rawValue(def.innerType, ctx, depth);
    case 'pipe':
      return rawValue(def.in, ctx, depth);
    case 'lazy':
      return rawValue((def.getter as () => unknown)(), ctx, depth + 1);
    case 'union':
      return fc.oneof(...(def.options as unknown[]).map(next));
    case 'intersection':
      return fc.tuple(next(def.left), next(def.right)).map(([a, b]) => (isPlain(a) && isPlain(b) ? { ...a, ...b } : a));
    case 'array': {
      const checks = checksOf(def);
      const minLength = Number(checks.find((c) => c.check === 'min_length')?.minimum ?? 0);
      return fc.array(next(def.element), { minLength, maxLength: Math.max(minLength, 3) });
    }
    case 'tuple':
      return fc.tuple(...(def.items as unknown[]).map(next));
    case 'record':
      return fc.dictionary(fc.string({ maxLength: 8 }), next(def.valueType), { maxKeys: 3 });
    case 'object': {
      const shape = def.shape as Record<string, unknown>;
      const keys = Object.keys(shape);
      if (keys.length === 0) return fc.constant({});
      return fc.record(Object.fromEntries(keys.map((k) => [k, next(shape[k])])) as Record<string, fc.Arbitrary<unknown>>);
    }
    default:
      return fc.jsonValue({ maxDepth: 2 });
  }
}

/** Every place in a JSON value a hostile value could be put: object keys and array slots, at any depth. */
function slotsOf(value: unknown, out: Array<[Record<string, unknown> | unknown[], string | number]> = []) {
  if (Array.isArray(value)) value.forEach((v, i) => (out.push([value, i]), slotsOf(v, out)));
  else if (isPlain(value)) for (const [k, v] of Object.entries(value)) out.push([value, k]), slotsOf(v, out);
  return out;
}

/** The body with one field replaced (or one unknown field added) by a hostile value. */
function poisoned(value: unknown, pick: number, hostile: unknown): unknown {
  const copy = structuredClone(value);
  const slots = slotsOf(copy);
  if (slots.length === 0 || pick % (slots.length + 1) === slots.length) {
    return isPlain(copy) ? { ...copy, unexpectedField: hostile } : hostile;
  }
  const [holder, key] = slots[pick % slots.length]!;
  (holder as Record<string | number, unknown>)[key] = hostile;
  return copy;
}

function isPlain(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

/** Splices prototype-polluting keys into a serialised object, as raw JSON text. */
function withProtoKeys(json: string): string {
  if (!json.startsWith('{')) return json;
  const rest = json.slice(1);
  return `{"__proto__":{"polluted":"yes"},"constructor":{"prototype":{"polluted":"yes"}}${rest === '}' ? '' : ','}${rest}`;
}

/** JSON text for a route's body: valid, valid but for one hostile field, poisoned with prototype keys, or anything at all. */
export function hostileBodyFor(schema: z.ZodType | null, ctx: FuzzContext): fc.Arbitrary<string> {
  if (!schema) return hostileBody;
  const serialise = (v: unknown) => JSON.stringify(v) ?? 'null';
  const valid = validValue(schema, ctx);
  return fc.oneof(
    { weight: 3, arbitrary: valid.map(serialise) },
    { weight: 4, arbitrary: fc.tuple(valid, fc.nat(), hostileLeaf).map(([v, pick, h]) => serialise(poisoned(v, pick, h))) },
    { weight: 1, arbitrary: valid.map((v) => withProtoKeys(serialise(v))) },
    { weight: 2, arbitrary: hostileBody },
  );
}

/** A query object for a route: valid, valid but for one hostile parameter, or repeated parameters. */
export function hostileQueryFor(schema: z.ZodType, ctx: FuzzContext): fc.Arbitrary<Record<string, unknown>> {
  const asQuery = (v: unknown): Record<string, unknown> => (isPlain(v) ? v : { q: v });
  const valid = validValue(schema, ctx).map(asQuery);
  return fc.oneof(
    { weight: 3, arbitrary: valid },
    { weight: 4, arbitrary: fc.tuple(valid, fc.nat(), hostileLeaf).map(([v, pick, h]) => asQuery(poisoned(v, pick, h))) },
    { weight: 1, arbitrary: fc.tuple(valid, fc.string({ maxLength: 8 })).map(([v, s]) => Object.fromEntries(Object.entries(v).map(([k, x]) => [k, [x, s]]))) },
  );
}
