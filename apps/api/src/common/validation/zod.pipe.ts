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

/** Validates a body or query with a shared zod schema and reports every issue with its field path. */
export class ZodPipe<S extends z.ZodType> implements PipeTransform<unknown, z.infer<S>> {
  constructor(private readonly schema: S) {}

  transform(value: unknown): z.infer<S> {
    const result = this.schema.safeParse(value ?? {});
    if (!result.success) throw new AppError('validation', 'Some fields need attention.', issuesOf(result.error));
    return result.data;
  }
}
