import { Alert, Anchor, Button, Stack, Text, Title } from '@mantine/core';
import { IconCircleCheck } from '@tabler/icons-react';
import { useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { useServerForm } from '../../../lib/form';
import { paths } from '../../../lib/paths';
import { useConfirmPasswordReset } from '../api/confirmPasswordReset';
import { NewPasswordFields } from '../components/NewPasswordFields';
import { passwordResetConfirmSchema } from '@hitchbook/shared/schemas/auth';
import { passwordsMatch } from '../passwordForms';

export function Component() {
  const [searchParams] = useSearchParams();
  const token = searchParams.get('token') ?? '';
  const [done, setDone] = useState(false);
  const { form, onSubmit, formError, submitting } = useServerForm({
    schema: passwordResetConfirmSchema,
    initialValues: { password: '', confirmPassword: '' },
    toPayload: ({ password }) => ({ token, password }),
    check: passwordsMatch('password'),
    mutation: useConfirmPasswordReset(),
    onSuccess: () => setDone(true),
  });

  if (!token) {
    return (
      <Stack gap="md">
        <Title order={1} size="h2">
          Reset your password
        </Title>
        <Alert color="clay">This page needs the link from the reset e-mail. Ask for a new one if it has gone missing.</Alert>
        <Anchor component={Link} to={paths.forgotPassword()} ta="center">
          Send me a new reset link
        </Anchor>
      </Stack>
    );
  }

  if (done) {
    return (
      <Stack gap="md">
        <Title order={1} size="h2">
          Password changed
        </Title>
        <Alert color="harbor" icon={<IconCircleCheck />}>
          Your new password is set, and every other sign-in was ended. Sign in with the new password.
        </Alert>
        <Button component={Link} to={paths.signIn()} size="lg" fullWidth>
          Sign in
        </Button>
      </Stack>
    );
  }

  return (
    <form onSubmit={onSubmit} noValidate>
      <Stack gap="md">
        <Title order={1} size="h2">
          Choose a new password
        </Title>
        <Text c="dimmed">At least 8 characters. A short sentence is easy to type on a phone and hard to guess.</Text>
        <FormErrorAlert message={formError} />
        {formError && (
          <Anchor component={Link} to={paths.forgotPassword()}>
            Send me a new reset link
          </Anchor>
        )}
        <NewPasswordFields form={form} passwordField="password" />
        <Button type="submit" size="lg" loading={submitting} fullWidth>
          Set the new password
        </Button>
      </Stack>
    </form>
  );
}
