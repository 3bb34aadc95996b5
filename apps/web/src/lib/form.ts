import { useEffect, useRef, useState, type FormEvent } from 'react';
import { useForm, type FormErrors } from '@mantine/form';
import type { UseMutationResult } from '@tanstack/react-query';
import type { ZodType } from 'zod';
import { hasPath, placeServerIssues, samePath, type IssuePathMap } from './serverIssues';

// Mantine's own constraint; unlike Record<string, unknown> it also accepts plain interfaces.
type FormValues = Record<string, any>;

function remapErrors<Values>(errors: FormErrors, issuePath: IssuePathMap<Values>, values: Values): FormErrors {
  const mapped: FormErrors = {};
  for (const [path, message] of Object.entries(errors)) mapped[issuePath(path, values)] ??= message;
  return mapped;
}

/**
 * The schema itself, or a loader for it: a page that must show quickly (the cab form) loads zod and its
 * schema right after it is drawn, and a submit before it has arrived waits for it rather than skip the checks.
 */
export type SchemaSource = ZodType | (() => Promise<ZodType>);

/** The schema's issues by dotted path, the last one for a path winning, as @mantine/form expects them. */
export function schemaErrors(schema: ZodType, payload: unknown): FormErrors {
  const parsed = schema.safeParse(payload);
  if (parsed.success) return {};
  const errors: FormErrors = {};
  for (const issue of parsed.error.issues) errors[issue.path.join('.')] = issue.message;
  return errors;
}

function useSchema(source: SchemaSource) {
  const loaded = useRef<ZodType | null>(typeof source === 'function' ? null : source);
  const loading = useRef<Promise<ZodType> | null>(null);
  const load = () => {
    if (typeof source !== 'function') return Promise.resolve(source);
    loading.current ??= source().then((schema) => (loaded.current = schema));
    return loading.current;
  };
  useEffect(() => {
    void load();
    // The source is fixed for the form's life.
  }, []);
  return { loaded, load };
}

interface ServerFormOptions<Values extends FormValues, Payload, Result> {
  /** The shared zod schema of the request; the form checks exactly what it is about to send. */
  schema: SchemaSource;
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
  const { loaded, load } = useSchema(schema);
  const form = useForm<Values>({
    mode: 'controlled',
    initialValues,
    // Until a loaded schema has arrived a field left after typing is checked by the form's own rules only;
    // a submit waits for it below.
    validate: (values) => ({
      ...(loaded.current ? remapErrors(schemaErrors(loaded.current, toPayload(values)), issuePath, values) : {}),
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

  const submit = form.onSubmit(
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

  const onSubmit = (event?: FormEvent<HTMLFormElement>) => {
    if (loaded.current) return submit(event);
    event?.preventDefault();
    // Should the schema's chunk not load (no signal, no service worker yet), the entry is still sent or
    // queued: the server checks it against the same schema either way.
    void load().then(
      () => submit(),
      () => submit(),
    );
  };

  return { form, onSubmit, formError, submitting: mutation.isPending };
}
