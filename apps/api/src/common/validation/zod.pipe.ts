import type { PipeTransform } from '@nestjs/common';
import type { z } from 'zod';
import { AppError, type FieldIssue } from '../errors/app-error.js';

export function issuesOf(error: z.ZodError): FieldIssue[] {
  return error.issues.map((issue) => {
    const keys = issue.code === 'unrecognized_keys' ? issue.keys : [];
    const base = issue.path.map(String).join('.');
    if (keys.length > 0) {
      return { path: keys.map((k) => (base ? `${base}.${k}` : k)).join(', '), message: `Unknown field${keys.length > 1 ? 's' : ''}: ${keys.join(', ')}.` };
    }
    return { path: base, message: issue.message };
  });
}

/**
 * The path of the first string holding a NUL character, which PostgreSQL text cannot store. Walked with
 * a stack, not recursion, so a deeply nested body cannot overflow it.
 */
export function nulCharacterPath(value: unknown): string | null {
  const stack: Array<[unknown, string]> = [[value, '']];
  while (stack.length > 0) {
    const [v, path] = stack.pop()!;
    if (typeof v === 'string') {
      if (v.includes('\u0000')) return path;
    } else if (v !== null && typeof v === 'object') {
      for (const [k, child] of Object.entries(v)) stack.push([child, path ? `${path}.${k}` : k]);
    }
  }
  return null;
}

/** Validates a body or query with a shared zod schema and reports every issue with its field path. */
export class ZodPipe<S extends z.ZodType> implements PipeTransform<unknown, z.infer<S>> {
  constructor(private readonly schema: S) {}

  transform(value: unknown): z.infer<S> {
    const nul = nulCharacterPath(value);
    if (nul !== null) throw new AppError('validation', 'Some fields need attention.', [{ path: nul, message: 'Text may not contain NUL characters.' }]);
    const result = this.schema.safeParse(value ?? {});
    if (!result.success) throw new AppError('validation', 'Some fields need attention.', issuesOf(result.error));
    return result.data;
  }
}
