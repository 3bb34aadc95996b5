import { Button, Group, Modal, Stack, Text, TextInput } from '@mantine/core';
import { useMediaQuery } from '@mantine/hooks';
import { invitationSchema } from '@hitchbook/shared/schemas/users';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { useServerForm } from '../../../lib/form';
import { useInviteUser, type InvitationInput } from '../api/inviteUser';
import { partyKindFor, RoleAndPartyFields } from './RoleAndPartyFields';

const EMPTY_INVITATION: InvitationInput = { email: '', name: '', role: 'operator', partyId: null };

function InviteForm({ onDone }: { onDone: () => void }) {
  const { form, onSubmit, formError, submitting } = useServerForm({
    schema: invitationSchema,
    initialValues: EMPTY_INVITATION,
    mutation: useInviteUser(),
    toPayload: (values): InvitationInput => ({
      email: values.email,
      name: values.name,
      role: values.role,
      partyId: partyKindFor(values.role) ? values.partyId : null,
    }),
    onSuccess: onDone,
  });

  return (
    <form onSubmit={onSubmit} noValidate>
      <Stack gap="md">
        <Text c="dimmed" size="sm">
          They get an e-mail with a link to choose their own password. The link works once.
        </Text>
        <FormErrorAlert message={formError} />
        <TextInput label="Name" autoFocus {...form.getInputProps('name')} />
        <TextInput label="E-mail" type="email" inputMode="email" {...form.getInputProps('email')} />
        <RoleAndPartyFields
          role={form.values.role}
          roleError={form.errors.role}
          partyId={form.values.partyId}
          partyError={form.errors.partyId}
          onChange={(change) => form.setValues(change)}
        />
        <Group justify="flex-end">
          <Button variant="default" onClick={onDone}>
            Cancel
          </Button>
          <Button type="submit" loading={submitting}>
            Send invitation
          </Button>
        </Group>
      </Stack>
    </form>
  );
}

export function InviteUserModal({ opened, onClose }: { opened: boolean; onClose: () => void }) {
  const phone = useMediaQuery('(max-width: 48em)');
  return (
    <Modal opened={opened} onClose={onClose} title="Invite someone" fullScreen={phone} size="lg">
      {opened && <InviteForm onDone={onClose} />}
    </Modal>
  );
}
