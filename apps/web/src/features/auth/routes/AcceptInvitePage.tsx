import { Alert, Anchor, Button, Skeleton, Stack, Text, TextInput, Title } from '@mantine/core';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { isApiError } from '../../../lib/api';
import { useServerForm } from '../../../lib/form';
import { paths } from '../../../lib/paths';
import { ROLE_LABELS } from '../../../lib/roleLabels';
import { useAcceptInvitation } from '../api/acceptInvitation';
import { useInvitation, type Invitation } from '../api/getInvitation';
import { NewPasswordFields } from '../components/NewPasswordFields';
import { acceptInvitationSchema } from '@hitchbook/shared/schemas/auth';
import { passwordsMatch } from '../passwordForms';

function AcceptForm({ token, invitation }: { token: string; invitation: Invitation }) {
  const navigate = useNavigate();
  const { form, onSubmit, formError, submitting } = useServerForm({
    schema: acceptInvitationSchema,
    initialValues: { name: '', password: '', confirmPassword: '' },
    toPayload: ({ name, password }) => ({ token, name, password }),
    check: passwordsMatch('password'),
    mutation: useAcceptInvitation(),
    onSuccess: () => navigate(paths.dashboard(), { replace: true }),
  });

  return (
    <form onSubmit={onSubmit} noValidate>
      <Stack gap="md">
        <Title order={1} size="h2">
          Join {invitation.operationName}
        </Title>
        <Text>
          You were invited as <strong>{ROLE_LABELS[invitation.role]}</strong> with the e-mail{' '}
          <strong>{invitation.email}</strong>. Choose your name and a password to finish.
        </Text>
        <FormErrorAlert message={formError} />
        <TextInput label="Your name" autoComplete="name" autoFocus {...form.getInputProps('name')} />
        <NewPasswordFields form={form} passwordField="password" label="Password" />
        <Button type="submit" size="lg" loading={submitting} fullWidth>
          Join and sign in
        </Button>
      </Stack>
    </form>
  );
}

export function Component() {
  const [searchParams] = useSearchParams();
  const token = searchParams.get('token') ?? '';
  const invitation = useInvitation(token);

  if (!token || (invitation.isError && isApiError(invitation.error) && invitation.error.status === 404)) {
    return (
      <Stack gap="md">
        <Title order={1} size="h2">
          This invitation can't be used
        </Title>
        <Alert color="clay">
          The link is incomplete, already used or expired. Ask the person who invited you to send a new invitation.
        </Alert>
        <Anchor component={Link} to={paths.signIn()} ta="center">
          I already have a sign-in
        </Anchor>
      </Stack>
    );
  }
  if (invitation.isError) return <FormErrorAlert message={invitation.error.message} />;
  if (!invitation.data) {
    return (
      <Stack gap="md">
        <Skeleton h={36} w="70%" />
        <Skeleton h={48} />
        <Skeleton h={48} />
        <Skeleton h={48} />
      </Stack>
    );
  }
  return <AcceptForm token={token} invitation={invitation.data} />;
}
