import { Button, Group, Modal, Stack, Text } from '@mantine/core';
import type { RateSheetDto } from '@hitchbook/shared/schemas/rate-sheets';
import { FormErrorAlert } from '../../../components/FormErrorAlert';
import { useArchiveRateSheet } from '../api/archiveRateSheet';

interface ArchiveSheetModalProps {
  sheet: RateSheetDto;
  opened: boolean;
  onClose: () => void;
}

export function ArchiveSheetModal({ sheet, opened, onClose }: ArchiveSheetModalProps) {
  const archive = useArchiveRateSheet(sheet.id);
  return (
    <Modal opened={opened} onClose={onClose} title={`Archive ${sheet.name}?`}>
      <Stack gap="md">
        <Text>
          From now on this sheet prices no new work. It stays readable, and invoices already issued keep the rates they
          were issued with.
        </Text>
        <FormErrorAlert message={archive.error?.message ?? null} />
        <Group justify="flex-end">
          <Button variant="default" onClick={onClose}>
            Keep it
          </Button>
          <Button color="clay" loading={archive.isPending} onClick={() => archive.mutate(undefined, { onSuccess: onClose })}>
            Archive sheet
          </Button>
        </Group>
      </Stack>
    </Modal>
  );
}
