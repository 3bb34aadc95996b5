import { useState } from 'react';
import { useForm, type FormErrors } from '@mantine/form';
import type { UseMutationResult } from '@tanstack/react-query';
import { zod4Resolver } from 'mantine-form-zod-resolver';
import type { $ZodType } from 'zod/v4/core';
import { isApiError } from './api';

// Mantine's own constraint; unlike Record<string, unknown> it also accepts plain interfaces.
type FormValues = Record<string, any>;

/** Turns a path in the request body into the path of the form field that holds it. */
export type IssuePathMap<Values = unknown> = (payloadPath: string, values: Values) => string;

const samePath: IssuePathMap = (path) => path;

function hasPath(values: unknown, path: string): boolean {
  let node: unknown = values;
  for (const part of path.split('.')) {
    if (typeof node !== 'object' || node === null || !(part in node)) return false;
    node = (node as Record<string, unknown>)[part];
  }
  return true;
}

function remapErrors<Values>(errors: FormErrors, issuePath: IssuePathMap<Values>, values: Values): FormErrors {
  const mapped: FormErrors = {};
  for (const [path, message] of Object.entries(errors)) mapped[issuePath(path, values)] ??= message;
  return mapped;
}

export interface PlacedIssues {
  fieldErrors: FormErrors;
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
  const fieldErrors: FormErrors = {};
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

interface ServerFormOptions<Values extends FormValues, Payload, Result> {
  /** The shared zod schema of the request; the form checks exactly what it is about to send. */
  schema: $ZodType;
  initialValues: Values;
  /** Builds the request body from the fields. Must not throw on half-filled input. */
  toPayload: (values: Values) => Payload;
  mutation: UseMutationResult<Result, Error, Payload>;
  onSuccess?: (result: Result, values: Values) => void;
  /** Rules only the form has, such as typing a new password twice. */
  check?: (values: Values) => FormErrors;
  /** Needed only when the request is shaped differently from the fields. */
  issuePath?: IssuePathMap<Values>;
}

/**
 * The one form recipe: @mantine/form validated by the shared request schema, submitted
 * through a TanStack mutation, with client and server issues shown on the same fields.
 */
export function useServerForm<Values extends FormValues, Payload, Result>(
  options: ServerFormOptions<Values, Payload, Result>,
) {
  const { schema, initialValues, toPayload, mutation, onSuccess, check, issuePath = samePath } = options;
  const resolver = zod4Resolver(schema);
  const form = useForm<Values>({
    mode: 'controlled',
    initialValues,
    validate: (values) => ({
      ...remapErrors(resolver(toPayload(values) as Record<string, unknown>), issuePath, values),
      ...check?.(values),
    }),
    // A field is checked when left after typing in it; an untouched empty field stays quiet,
    // so moving past it (say, to "Forgot your password?") does not shout at the user.
    enhanceGetInputProps: ({ field, form: self }) => ({
      onBlur: () => {
        if (self.isDirty(field)) self.validateField(field);
      },
    }),
  });
  const [formError, setFormError] = useState<string | null>(null);

  const onSubmit = form.onSubmit(
    (values) => {
      setFormError(null);
      mutation.mutate(toPayload(values), {
        onSuccess: (result) => onSuccess?.(result, values),
        onError: (error) => {
          const { fieldErrors, banner } = placeServerIssues(form.getValues(), error, issuePath);
          form.setErrors(fieldErrors);
          setFormError(banner);
        },
      });
    },
    // A rule about the request as a whole (or a hidden field) has no input to show it under.
    (errors, values) => {
      const unplaced = Object.entries(errors)
        .filter(([path, message]) => message && !hasPath(values, path))
        .map(([, message]) => String(message));
      setFormError(unplaced.length > 0 ? unplaced.join(' ') : null);
    },
  );

  return { form, onSubmit, formError, submitting: mutation.isPending };
}
