import { Button, Group, Stack, Text } from '@mantine/core';
import type { InvoiceDto } from '@hitchbook/shared/schemas/invoices';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { useDeleteDraft } from '../api/deleteDraft';
import { ActionModal } from './ActionModal';

interface DeleteDraftModalProps {
  invoice: InvoiceDto;
  opened: boolean;
  onClose: () => void;
  onDeleted: () => void;
}

export function DeleteDraftModal({ invoice, opened, onClose, onDeleted }: DeleteDraftModalProps) {
  const remove = useDeleteDraft(invoice.id);
  return (
    <ActionModal opened={opened} onClose={onClose} title="Delete this draft?">
      <Stack gap="md">
        <Text>Nothing was numbered or sent. The draft lets go of its work entries: approved again, they can be corrected or go on another invoice.</Text>
        <FormErrorAlert message={remove.error?.message ?? null} />
        <Group justify="flex-end">
          <Button variant="default" onClick={onClose}>
            Keep it
          </Button>
          <Button color="red" loading={remove.isPending} onClick={() => remove.mutate(undefined, { onSuccess: onDeleted })}>
            Delete draft
          </Button>
        </Group>
      </Stack>
    </ActionModal>
  );
}
