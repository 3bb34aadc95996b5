import { Button, Group, Modal, Stack, Text } from '@mantine/core';
import type { FieldDto } from '@hitchbook/shared/schemas/fields';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { useSetFieldArchived } from '../api/updateField';

/** Archiving is reversible and loses nothing: old entries keep their field. */
export function ArchiveFieldModal({ field, onClose }: { field: FieldDto | null; onClose: () => void }) {
  const archive = useSetFieldArchived();
  const restoring = field?.archived ?? false;
  return (
    <Modal opened={field !== null} onClose={onClose} title={restoring ? `Bring back ${field?.name}` : `Archive ${field?.name}`}>
      <Stack gap="md">
        <FormErrorAlert message={archive.error?.message ?? null} />
        <Text>
          {restoring
            ? 'It will be offered again when work is logged.'
            : 'It stays on every entry that used it but is no longer offered when work is logged. You can bring it back later.'}
        </Text>
        <Group justify="flex-end">
          <Button variant="default" onClick={onClose}>
            Cancel
          </Button>
          <Button
            color={restoring ? undefined : 'clay'}
            loading={archive.isPending}
            onClick={() => field && archive.mutate({ id: field.id, archived: !restoring }, { onSuccess: onClose })}
          >
            {restoring ? 'Bring back' : 'Archive'}
          </Button>
        </Group>
      </Stack>
    </Modal>
  );
}
