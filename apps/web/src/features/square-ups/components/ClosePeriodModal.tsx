import { Alert, Button, Group, Modal, Stack, Text } from '@mantine/core';
import { IconAlertTriangle } from '@tabler/icons-react';
import { useCloseSquareUp } from '../api/closeSquareUp';

/** Closing freezes the statement; the modal says so before it happens, and shows why the server refused. */
export function ClosePeriodModal({ squareUpId, name, pendingEntries, opened, onClose }: { squareUpId: string; name: string; pendingEntries: number; opened: boolean; onClose: () => void }) {
  const close = useCloseSquareUp(squareUpId);
  return (
    <Modal opened={opened} onClose={onClose} title={`Close ${name}?`} size="md">
      <Stack gap="md">
        <Text>
          The statement is frozen as it stands and its transfers are recorded, ready to be marked paid. Later edits to costs
          or work dated in this period no longer change it: a correction goes into the next period.
        </Text>
        {pendingEntries > 0 && (
          <Alert color="clay" variant="light" icon={<IconAlertTriangle />}>
            {pendingEntries} work {pendingEntries === 1 ? 'entry waits' : 'entries wait'} for approval in this period. Approve
            or reject them first; the period cannot close while they wait.
          </Alert>
        )}
        {close.isError && (
          <Alert color="red" role="alert" data-testid="close-error">
            {close.error.message}
          </Alert>
        )}
        <Group justify="flex-end">
          <Button variant="default" onClick={onClose}>
            Cancel
          </Button>
          <Button color="clay" loading={close.isPending} onClick={() => close.mutate(undefined, { onSuccess: onClose })}>
            Close the period
          </Button>
        </Group>
      </Stack>
    </Modal>
  );
}
