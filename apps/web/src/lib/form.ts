import { useState, type FormEvent } from 'react';
import { useForm, type FormErrors } from '@mantine/form';
import type { UseMutationResult } from '@tanstack/react-query';
import { useSchema, type SchemaSource } from './lazySchema';
import { placeServerIssues, remapErrors, samePath, schemaErrors, unplacedIssues, type IssuePathMap } from './serverIssues';

// Mantine's own constraint; unlike Record<string, unknown> it also accepts plain interfaces.
type FormValues = Record<string, any>;

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
  const { loaded, whenLoaded } = useSchema(schema);
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
    (errors, values) => setFormError(unplacedIssues(errors, values)),
  );

  const onSubmit = (event?: FormEvent<HTMLFormElement>) => {
    event?.preventDefault();
    whenLoaded(() => submit());
  };

  return { form, onSubmit, formError, submitting: mutation.isPending };
}
