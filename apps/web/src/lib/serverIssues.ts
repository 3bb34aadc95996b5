import type { ReactNode } from 'react';
import type { ZodType } from 'zod';
import { isApiError } from './api';

// The same shape as @mantine/form's errors, without loading it: the sign-in page checks its two fields by hand.
export type FieldErrors = Record<string, ReactNode>;

/** Turns a path in the request body into the path of the form field that holds it. */
export type IssuePathMap<Values = unknown> = (payloadPath: string, values: Values) => string;

export const samePath: IssuePathMap = (path) => path;

export function hasPath(values: unknown, path: string): boolean {
  let node: unknown = values;
  for (const part of path.split('.')) {
    if (typeof node !== 'object' || node === null || !(part in node)) return false;
    node = (node as Record<string, unknown>)[part];
  }
  return true;
}

export interface PlacedIssues {
  fieldErrors: FieldErrors;
  /** The server's message (when some field is marked) plus every issue no field on this form can show. */
  banner: string;
}

/** Sorts a failed request's issues into those a field can show and those only a banner can. */
export function placeServerIssues<Values>(
  values: Values,
  error: unknown,
  issuePath: IssuePathMap<Values> = samePath,
): PlacedIssues {
  if (!isApiError(error)) return { fieldErrors: {}, banner: 'Something went wrong. Try again.' };
  const fieldErrors: FieldErrors = {};
  const unplaced: string[] = [];
  for (const issue of error.issues) {
    const path = issue.path ? issuePath(issue.path, values) : '';
    if (path && hasPath(values, path)) fieldErrors[path] ??= issue.message;
    else unplaced.push(issue.message);
  }
  // When no field is marked, a general "check the fields" message would send the user hunting.
  const lead = Object.keys(fieldErrors).length === 0 && unplaced.length > 0 ? [] : [error.message];
  return { fieldErrors, banner: [...lead, ...unplaced.filter((m) => m !== error.message)].join(' ') };
}

/** The schema's issues by dotted path, the last one for a path winning, as the forms show them. */
export function schemaErrors(schema: ZodType, payload: unknown): FieldErrors {
  const parsed = schema.safeParse(payload);
  if (parsed.success) return {};
  const errors: FieldErrors = {};
  for (const issue of parsed.error.issues) errors[issue.path.join('.')] = issue.message;
  return errors;
}

/** Moves each issue from the request's path to the form field that holds it. */
export function remapErrors<Values>(errors: FieldErrors, issuePath: IssuePathMap<Values>, values: Values): FieldErrors {
  const mapped: FieldErrors = {};
  for (const [path, message] of Object.entries(errors)) mapped[issuePath(path, values)] ??= message;
  return mapped;
}

/** The messages of a failed check that no field on the form can show (a rule about the whole request, a hidden field), as one banner. */
export function unplacedIssues(errors: FieldErrors, values: unknown): string | null {
  const unplaced = Object.entries(errors)
    .filter(([path, message]) => message && !hasPath(values, path))
    .map(([, message]) => String(message));
  return unplaced.length > 0 ? unplaced.join(' ') : null;
}
