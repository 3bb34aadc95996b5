import { Alert, Button, Card, Group, SimpleGrid, Stack, Text, Title, PasswordInput } from '@mantine/core';
import { IconCircleCheck } from '@tabler/icons-react';
import { useState } from 'react';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { PageHeader } from '../../../components/PageHeader';
import { useSessionUserOrThrow } from '../../../lib/auth';
import { useServerForm } from '../../../lib/form';
import { ROLE_DESCRIPTIONS, ROLE_LABELS } from '../../../lib/roleLabels';
import { useChangePassword } from '../api/changePassword';
import { NewPasswordFields } from '../components/NewPasswordFields';
import { passwordChangeSchema } from '@hitchbook/shared/schemas/auth';
import { passwordsMatch } from '../passwordForms';

const EMPTY = { currentPassword: '', newPassword: '', confirmPassword: '' };

function ChangePasswordCard({ email }: { email: string }) {
  const [changed, setChanged] = useState(false);
  const { form, onSubmit, formError, submitting } = useServerForm({
    schema: passwordChangeSchema,
    initialValues: EMPTY,
    toPayload: ({ currentPassword, newPassword }) => ({ currentPassword, newPassword }),
    check: passwordsMatch('newPassword'),
    mutation: useChangePassword(),
    onSuccess: () => {
      form.setValues(EMPTY);
      setChanged(true);
    },
  });

  return (
    <Card withBorder padding="lg">
      <form onSubmit={onSubmit} noValidate>
        <Stack gap="md">
          <Title order={2} size="h3">
            Change password
          </Title>
          <Text c="dimmed" size="sm">
            Changing it signs you out everywhere else, for example on a phone you lent out.
          </Text>
          {changed && (
            <Alert color="harbor" icon={<IconCircleCheck />} withCloseButton onClose={() => setChanged(false)}>
              Password changed. Other sign-ins have ended.
            </Alert>
          )}
          <FormErrorAlert message={formError} />
          {/* Lets a password manager file the new password under the right sign-in. */}
          <input type="text" name="username" autoComplete="username" value={email} readOnly hidden />
          <PasswordInput label="Current password" autoComplete="current-password" {...form.getInputProps('currentPassword')} />
          <NewPasswordFields form={form} passwordField="newPassword" />
          <Group>
            <Button type="submit" loading={submitting}>
              Change password
            </Button>
          </Group>
        </Stack>
      </form>
    </Card>
  );
}

function Detail({ label, value }: { label: string; value: string }) {
  return (
    <Stack gap={2}>
      <Text size="sm" c="dimmed">
        {label}
      </Text>
      <Text fw={700}>{value}</Text>
    </Stack>
  );
}

export function Component() {
  const user = useSessionUserOrThrow();
  return (
    <>
      <PageHeader title="Account" description="Your sign-in for this operation." />
      <SimpleGrid cols={{ base: 1, md: 2 }} spacing="lg">
        <Card withBorder padding="lg">
          <Stack gap="md">
            <Title order={2} size="h3">
              You
            </Title>
            <Detail label="Name" value={user.name} />
            <Detail label="E-mail" value={user.email} />
            <Detail label="Operation" value={user.operationName} />
            <Stack gap={2}>
              <Detail label="Role" value={ROLE_LABELS[user.role]} />
              <Text size="sm">{ROLE_DESCRIPTIONS[user.role]}</Text>
            </Stack>
          </Stack>
        </Card>
        <ChangePasswordCard email={user.email} />
      </SimpleGrid>
    </>
  );
}
