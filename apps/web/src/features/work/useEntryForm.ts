import { useRef, useState, type FormEvent, type ReactNode } from 'react';
import { useSchema, type SchemaSource } from '../../lib/lazySchema';
import { placeServerIssues, remapErrors, schemaErrors, unplacedIssues, type FieldErrors } from '../../lib/serverIssues';
import { entryIssuePath, type EntryFormValues } from './entryForm';

type EntryField = keyof EntryFormValues;

/** What an input gets from the form: its value, its change and leave handlers, its message. */
export interface EntryInputProps {
  value: string;
  onChange: (valueOrEvent: unknown) => void;
  onBlur: () => void;
  error?: ReactNode;
}

/** The part of the form the entry fields use. */
export interface EntryFormControls {
  getValues: () => EntryFormValues;
  setFieldValue: (field: EntryField, value: string) => void;
  getInputProps: (field: EntryField) => EntryInputProps;
}

interface EntryFormOptions<Payload, Result> {
  schema: SchemaSource;
  initialValues: EntryFormValues;
  /** Builds the request body from the fields. Must not throw on half-filled input. */
  toPayload: (values: EntryFormValues) => Payload;
  /** Sends (or keeps on the phone) the entry; a rejection carries the server's issues. */
  send: (payload: Payload) => Promise<Result>;
  onSuccess?: (result: Result, values: EntryFormValues) => void;
}

function typedValue(valueOrEvent: unknown): string {
  if (typeof valueOrEvent === 'object' && valueOrEvent !== null && 'currentTarget' in valueOrEvent) {
    return (valueOrEvent as { currentTarget: { value: string } }).currentTarget.value;
  }
  return String(valueOrEvent ?? '');
}

/**
 * The work-entry forms (new, fixed on the phone, edited): the same checks, messages and server-issue placing
 * as the other forms' recipe (lib/form.ts), in a few lines of React state instead of @mantine/form and a query
 * mutation. The cab page loads neither, so a phone with one bar gets a form it can fill in sooner.
 */
export function useEntryForm<Payload, Result>({ schema, initialValues, toPayload, send, onSuccess }: EntryFormOptions<Payload, Result>) {
  const { loaded, whenLoaded } = useSchema(schema);
  const [values, setValues] = useState(initialValues);
  // Several fields change in one handler (a picked field fills its acres); each change builds on the last.
  const current = useRef(values);
  const [errors, setErrorsState] = useState<FieldErrors>({});
  const [formError, setFormError] = useState<string | null>(null);
  const [submitting, setSubmitting] = useState(false);

  const check = (checked: EntryFormValues): FieldErrors =>
    loaded.current ? remapErrors(schemaErrors(loaded.current, toPayload(checked)), entryIssuePath, checked) : {};

  const setFieldValue = (field: EntryField, value: string) => {
    current.current = { ...current.current, [field]: value };
    setValues(current.current);
    setErrorsState((shown) => (field in shown ? Object.fromEntries(Object.entries(shown).filter(([path]) => path !== field)) : shown));
  };

  const form: EntryFormControls & { setErrors: (next: FieldErrors) => void } = {
    getValues: () => values,
    setFieldValue,
    // A field is checked when left after typing in it; an untouched empty field stays quiet.
    getInputProps: (field) => ({
      value: values[field],
      onChange: (valueOrEvent) => setFieldValue(field, typedValue(valueOrEvent)),
      onBlur: () => {
        if (current.current[field] === initialValues[field]) return;
        const message = check(current.current)[field];
        setErrorsState((shown) => {
          const { [field]: _left, ...others } = shown;
          return message ? { ...others, [field]: message } : others;
        });
      },
      error: errors[field],
    }),
    setErrors: setErrorsState,
  };

  const submitNow = () => {
    const sent = current.current;
    const found = check(sent);
    if (Object.keys(found).length > 0) {
      setErrorsState(found);
      setFormError(unplacedIssues(found, sent));
      return;
    }
    setFormError(null);
    setSubmitting(true);
    send(toPayload(sent)).then(
      (result) => {
        setSubmitting(false);
        onSuccess?.(result, sent);
      },
      (error: unknown) => {
        setSubmitting(false);
        const { fieldErrors, banner } = placeServerIssues(current.current, error, entryIssuePath);
        setErrorsState(fieldErrors);
        setFormError(banner);
      },
    );
  };

  const onSubmit = (event?: FormEvent<HTMLFormElement>) => {
    event?.preventDefault();
    if (!submitting) whenLoaded(submitNow);
  };

  return { form, onSubmit, formError, submitting };
}
