import type { ZodType } from 'zod';

/** The shared create schema, fetched after the cab form is drawn: zod is a quarter of what the form would load first. */
export function loadEntrySchema(): Promise<ZodType> {
  return import('@hitchbook/shared/schemas/work-entries').then((module) => module.workEntryCreateSchema);
}
