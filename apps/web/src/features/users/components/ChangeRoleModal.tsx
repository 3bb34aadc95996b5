import { Button, Group, Modal, Stack, Text } from '@mantine/core';
import { useMediaQuery } from '@mantine/hooks';
import { membershipUpdateSchema } from '@hitchbook/shared/schemas/users';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { useServerForm } from '../../../lib/form';
import type { Member } from '../api/listUsers';
import { useUpdateMembership, type MembershipChange } from '../api/updateMembership';
import { partyKindFor, RoleAndPartyFields } from './RoleAndPartyFields';

function ChangeRoleForm({ member, onDone }: { member: Member; onDone: () => void }) {
  const { form, onSubmit, formError, submitting } = useServerForm({
    schema: membershipUpdateSchema,
    initialValues: { role: member.role, partyId: member.partyId } as MembershipChange,
    mutation: useUpdateMembership(member.membershipId),
    toPayload: (values): MembershipChange => ({
      role: values.role,
      partyId: partyKindFor(values.role) ? values.partyId : null,
    }),
    onSuccess: onDone,
  });

  return (
    <form onSubmit={onSubmit} noValidate>
      <Stack gap="md">
        <Text>
          {member.name} · {member.email}
        </Text>
        <FormErrorAlert message={formError} />
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
            Save role
          </Button>
        </Group>
      </Stack>
    </form>
  );
}

export function ChangeRoleModal({ member, onClose }: { member: Member | null; onClose: () => void }) {
  const phone = useMediaQuery('(max-width: 48em)');
  return (
    <Modal opened={member !== null} onClose={onClose} title="Change role" fullScreen={phone} size="lg">
      {member && <ChangeRoleForm key={member.membershipId} member={member} onDone={onClose} />}
    </Modal>
  );
}
