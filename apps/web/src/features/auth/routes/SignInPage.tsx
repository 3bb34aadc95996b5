import { Anchor, Button, PasswordInput, Stack, TextInput, Title } from '@mantine/core';
import { loginSchema } from '@hitchbook/shared/schemas/auth';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { useServerForm } from '../../../lib/form';
import { paths, safeNextPath } from '../../../lib/paths';
import { useSignIn } from '../api/signIn';

export function Component() {
  const [searchParams] = useSearchParams();
  const navigate = useNavigate();
  const { form, onSubmit, formError, submitting } = useServerForm({
    schema: loginSchema,
    initialValues: { email: '', password: '' },
    mutation: useSignIn(),
    toPayload: (values) => values,
    onSuccess: () => navigate(safeNextPath(searchParams.get('next')), { replace: true }),
  });

  return (
    <form onSubmit={onSubmit} noValidate>
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
          {...form.getInputProps('email')}
        />
        <PasswordInput label="Password" autoComplete="current-password" {...form.getInputProps('password')} />
        <Button type="submit" size="lg" loading={submitting} fullWidth>
          Sign in
        </Button>
        <Anchor component={Link} to={paths.forgotPassword()} ta="center">
          Forgot your password?
        </Anchor>
      </Stack>
    </form>
  );
}
