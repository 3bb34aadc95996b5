import { useState, type ChangeEvent, type FormEvent } from 'react';
import { Anchor, Button, Stack, TextInput, Title } from '@mantine/core';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { useAuth } from '../../../lib/auth';
import { paths, safeNextPath } from '../../../lib/paths';
import { placeServerIssues, type FieldErrors } from '../../../lib/serverIssues';
import { SignInPasswordField } from '../components/SignInPasswordField';
import { signInIssues, type SignInValues } from '../signInChecks';

// The first page most people see, often on a phone in a yard: two fields checked by hand rather than
// through the form recipe, so it loads neither zod nor the query cache. It behaves like the recipe: a
// field is checked when left after typing in it, everything on submit, the server's issues on their fields.
// It needs no router either: opened straight it is drawn on its own (app/signin), and once signed in the
// person goes on with a page load, which brings the rest of the app.
export function Component() {
  const { signIn } = useAuth();
  const [values, setValues] = useState<SignInValues>({ email: '', password: '' });
  const [errors, setErrors] = useState<FieldErrors>({});
  const [formError, setFormError] = useState<string | null>(null);
  const [submitting, setSubmitting] = useState(false);

  function field(name: keyof SignInValues) {
    return {
      value: values[name],
      error: errors[name],
      onChange: (event: ChangeEvent<HTMLInputElement>) => {
        const value = event.currentTarget.value;
        setValues((current) => ({ ...current, [name]: value }));
        setErrors(({ [name]: _cleared, ...rest }) => rest);
      },
      onBlur: () => {
        if (values[name] === '') return;
        const issue = signInIssues(values)[name];
        setErrors(({ [name]: _old, ...rest }) => (issue ? { ...rest, [name]: issue } : rest));
      },
    };
  }

  async function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const issues = signInIssues(values);
    setErrors(issues);
    setFormError(null);
    if (Object.keys(issues).length > 0 || submitting) return;
    setSubmitting(true);
    try {
      await signIn(values.email, values.password);
      window.location.replace(safeNextPath(new URLSearchParams(window.location.search).get('next')));
    } catch (error) {
      const { fieldErrors, banner } = placeServerIssues(values, error);
      setErrors(fieldErrors);
      setFormError(banner);
    } finally {
      setSubmitting(false);
    }
  }

  return (
    <form onSubmit={(event) => void onSubmit(event)} noValidate>
      <Stack gap="md">
        <Title order={1} size="h2">
          Sign in
        </Title>
        <FormErrorAlert message={formError} />
        <TextInput
          label="E-mail"
          type="email"
          autoComplete="username"
          inputMode="email"
          autoFocus
          {...field('email')}
        />
        <SignInPasswordField label="Password" autoComplete="current-password" {...field('password')} />
        <Button type="submit" size="lg" loading={submitting} fullWidth>
          Sign in
        </Button>
        <Anchor href={paths.forgotPassword()} ta="center">
          Forgot your password?
        </Anchor>
      </Stack>
    </form>
  );
}
