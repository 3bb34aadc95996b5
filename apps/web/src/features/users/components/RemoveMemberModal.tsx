import { Button, Group, Modal, Stack, Text } from '@mantine/core';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import type { Member } from '../api/listUsers';
import { useRemoveMembership } from '../api/removeMembership';

export function RemoveMemberModal({ member, onClose }: { member: Member | null; onClose: () => void }) {
  const removal = useRemoveMembership();

  function close() {
    removal.reset();
    onClose();
  }

  return (
    <Modal opened={member !== null} onClose={close} title="Remove from this operation">
      {member && (
        <Stack gap="md">
          <Text>
            <strong>{member.name}</strong> ({member.email}) will no longer be able to sign in to this operation. Work
            they logged stays on the books.
          </Text>
          <FormErrorAlert message={removal.error?.message ?? null} />
          <Group justify="flex-end">
            <Button variant="default" onClick={close}>
              Keep
            </Button>
            <Button
              color="red"
              loading={removal.isPending}
              onClick={() => removal.mutate(member.membershipId, { onSuccess: close })}
            >
              Remove
            </Button>
          </Group>
        </Stack>
      )}
    </Modal>
  );
}
