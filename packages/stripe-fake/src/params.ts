import { invalidRequest } from './api-error.js';
import type { FormHash, FormValue } from './form-encoding.js';

export type Metadata = Record<string, string>;

const METADATA_MAX_KEYS = 50;
const METADATA_KEY_MAX = 40;
const METADATA_VALUE_MAX = 500;

/**
 * Reads one level of request parameters by name, with Stripe's messages for each kind of mistake.
 * Every name read is remembered, so `rejectUnknown()` can refuse the rest as Stripe does
 * ("Received unknown parameter: …"), which catches a misspelt parameter before it reaches real Stripe.
 */
export class Params {
  private readonly read = new Set<string>();
  private readonly nested: Params[] = [];

  constructor(
    private readonly values: FormHash,
    private readonly prefix = '',
  ) {}

  nameOf(key: string): string {
    return this.prefix ? `${this.prefix}[${key}]` : key;
  }

  has(key: string): boolean {
    return this.values[key] !== undefined;
  }

  private take(key: string): FormValue | undefined {
    this.read.add(key);
    return this.values[key];
  }

  string(key: string, { maxLength = 5000 }: { maxLength?: number } = {}): string | undefined {
    const value = this.take(key);
    if (value === undefined || value === '') return undefined;
    if (typeof value !== 'string') throw invalidRequest(`Invalid string: ${this.nameOf(key)} must be a single value, not a hash or a list.`, { param: this.nameOf(key) });
    if (value.length > maxLength) {
      throw invalidRequest(`Invalid ${this.nameOf(key)}: must be at most ${maxLength} characters`, { param: this.nameOf(key), code: 'parameter_invalid_string_too_long' });
    }
    return value;
  }

  requiredString(key: string, options?: { maxLength?: number }): string {
    const present = this.values[key] !== undefined;
    const value = this.string(key, options);
    if (value !== undefined) return value;
    if (present) throw this.emptyError(key);
    throw this.missingError(key);
  }

  integer(key: string, { min, max }: { min: number; max: number }): number | undefined {
    const raw = this.string(key);
    if (raw === undefined) return undefined;
    if (!/^-?\d+$/.test(raw)) throw invalidRequest(`Invalid integer: ${raw}`, { param: this.nameOf(key), code: 'parameter_invalid_integer' });
    const value = Number(raw);
    if (value < min) throw invalidRequest(`${this.nameOf(key)} must be greater than or equal to ${min}.`, { param: this.nameOf(key) });
    if (value > max) throw invalidRequest(`${this.nameOf(key)} must be less than or equal to ${max}.`, { param: this.nameOf(key) });
    return value;
  }

  requiredInteger(key: string, range: { min: number; max: number }): number {
    const value = this.integer(key, range);
    if (value === undefined) throw this.values[key] === undefined ? this.missingError(key) : this.emptyError(key);
    return value;
  }

  boolean(key: string): boolean | undefined {
    const raw = this.string(key);
    if (raw === undefined) return undefined;
    if (raw !== 'true' && raw !== 'false') throw invalidRequest(`Invalid boolean: ${raw}`, { param: this.nameOf(key) });
    return raw === 'true';
  }

  oneOf<T extends string>(key: string, allowed: readonly T[]): T | undefined {
    const raw = this.string(key);
    if (raw === undefined) return undefined;
    if (!(allowed as readonly string[]).includes(raw)) {
      throw invalidRequest(`Invalid ${this.nameOf(key)}: must be one of ${listWords(allowed)}`, { param: this.nameOf(key) });
    }
    return raw as T;
  }

  hash(key: string): Params | undefined {
    const value = this.take(key);
    if (value === undefined || value === '') return undefined;
    if (typeof value === 'string' || Array.isArray(value)) throw invalidRequest(`Invalid hash: ${this.nameOf(key)} must be a hash.`, { param: this.nameOf(key) });
    return this.child(value, this.nameOf(key));
  }

  /** A list of hashes, such as `line_items`. */
  hashList(key: string): Params[] | undefined {
    const value = this.take(key);
    if (value === undefined || value === '') return undefined;
    if (!Array.isArray(value)) throw invalidRequest(`Invalid array: ${this.nameOf(key)} must be a list, sent as ${this.nameOf(key)}[0], ${this.nameOf(key)}[1], …`, { param: this.nameOf(key) });
    return value.map((item, i) => {
      const name = `${this.nameOf(key)}[${i}]`;
      if (typeof item === 'string' || Array.isArray(item)) throw invalidRequest(`Invalid hash: ${name} must be a hash.`, { param: name });
      return this.child(item, name);
    });
  }

  stringList(key: string): string[] | undefined {
    const value = this.take(key);
    if (value === undefined || value === '') return undefined;
    if (!Array.isArray(value)) throw invalidRequest(`Invalid array: ${this.nameOf(key)} must be a list, sent as ${this.nameOf(key)}[0], ${this.nameOf(key)}[1], …`, { param: this.nameOf(key) });
    return value.map((item, i) => {
      if (typeof item !== 'string') throw invalidRequest(`Invalid string: ${this.nameOf(key)}[${i}] must be a single value.`, { param: `${this.nameOf(key)}[${i}]` });
      return item;
    });
  }

  /** Stripe's metadata rules: at most 50 keys of up to 40 characters, values of up to 500; an empty value means "not set". */
  metadata(key = 'metadata'): Metadata {
    const value = this.take(key);
    const name = this.nameOf(key);
    if (value === undefined || value === '') return {};
    if (typeof value === 'string' || Array.isArray(value)) throw invalidRequest(`Invalid hash: ${name} must be a hash of keys and values, sent as ${name}[key]=value.`, { param: name });
    const entries = Object.entries(value);
    if (entries.length > METADATA_MAX_KEYS) {
      throw invalidRequest(`Invalid ${name}: metadata can have up to ${METADATA_MAX_KEYS} keys, but you've specified ${entries.length}.`, { param: name });
    }
    const metadata: Metadata = {};
    for (const [k, v] of entries) {
      if (typeof v !== 'string') throw invalidRequest(`Invalid ${name}[${k}]: metadata values must be strings.`, { param: `${name}[${k}]` });
      if (k.length > METADATA_KEY_MAX) throw invalidRequest(`Invalid ${name}: keys must be at most ${METADATA_KEY_MAX} characters long ("${k}" is ${k.length}).`, { param: `${name}[${k}]` });
      if (v.length > METADATA_VALUE_MAX) throw invalidRequest(`Invalid ${name}[${k}]: values must be at most ${METADATA_VALUE_MAX} characters long.`, { param: `${name}[${k}]` });
      if (v !== '') metadata[k] = v;
    }
    return metadata;
  }

  expand(): string[] {
    return this.stringList('expand') ?? [];
  }

  /** Refuses any parameter no endpoint code asked for, here and in every hash read from here. */
  rejectUnknown(): void {
    const unknown = Object.keys(this.values).find((k) => !this.read.has(k));
    if (unknown !== undefined) {
      throw invalidRequest(`Received unknown parameter: ${this.nameOf(unknown)}`, { param: this.nameOf(unknown), code: 'parameter_unknown' });
    }
    for (const child of this.nested) child.rejectUnknown();
  }

  missingError(key: string) {
    return invalidRequest(`Missing required param: ${this.nameOf(key)}.`, { param: this.nameOf(key), code: 'parameter_missing' });
  }

  private emptyError(key: string) {
    const name = this.nameOf(key);
    return invalidRequest(
      `You passed an empty string for '${name}'. We assume empty values are an attempt to unset a parameter; however '${name}' cannot be unset. You should remove '${name}' from your request or supply a non-empty value.`,
      { param: name, code: 'parameter_invalid_empty' },
    );
  }

  private child(values: FormHash, prefix: string): Params {
    const params = new Params(values, prefix);
    this.nested.push(params);
    return params;
  }
}

/** "a, b, or c", the way Stripe lists allowed values. */
export function listWords(words: readonly string[]): string {
  if (words.length <= 2) return words.join(' or ');
  return `${words.slice(0, -1).join(', ')}, or ${words[words.length - 1]}`;
}
