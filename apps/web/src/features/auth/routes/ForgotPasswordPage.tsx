import { Alert, Anchor, Button, Stack, Text, TextInput, Title } from '@mantine/core';
import { passwordResetRequestSchema } from '@hitchbook/shared/schemas/auth';
import { IconMailCheck } from '@tabler/icons-react';
import { useState } from 'react';
import { Link } from 'react-router-dom';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { useServerForm } from '../../../lib/form';
import { paths } from '../../../lib/paths';
import { useRequestPasswordReset } from '../api/requestPasswordReset';

export function Component() {
  const [answer, setAnswer] = useState<string | null>(null);
  const { form, onSubmit, formError, submitting } = useServerForm({
    schema: passwordResetRequestSchema,
    initialValues: { email: '' },
    mutation: useRequestPasswordReset(),
    toPayload: (values) => values,
    onSuccess: (result) => setAnswer(result.message),
  });

  return (
    <Stack gap="md">
      <Title order={1} size="h2">
        Reset your password
      </Title>
      {answer ? (
        <Alert color="harbor" icon={<IconMailCheck />} data-testid="reset-requested">
          {answer}
        </Alert>
      ) : (
        <form onSubmit={onSubmit} noValidate>
          <Stack gap="md">
            <Text c="dimmed">Enter the e-mail you sign in with. If it has an account, a reset link is on its way.</Text>
            <FormErrorAlert message={formError} />
            <TextInput label="E-mail" type="email" autoComplete="username" autoFocus {...form.getInputProps('email')} />
            <Button type="submit" size="lg" loading={submitting} fullWidth>
              Send the reset link
            </Button>
          </Stack>
        </form>
      )}
      <Anchor component={Link} to={paths.signIn()} ta="center">
        Back to sign in
      </Anchor>
    </Stack>
  );
}
