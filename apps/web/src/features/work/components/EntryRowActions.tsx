import { ActionIcon, Group, Tooltip } from '@mantine/core';
import { notifications } from '@mantine/notifications';
import { IconArrowBackUp, IconCircleCheck, IconEye, IconPencil, IconSend } from '@tabler/icons-react';
import { Link } from 'react-router-dom';
import type { WorkEntryDto } from '@hitchbook/shared/schemas/work-entries';
import { paths } from '../../../lib/paths';
import { useApproveWorkEntry } from '../api/approveWorkEntry';
import { useReopenWorkEntry } from '../api/reopenWorkEntry';
import { useSubmitWorkEntry } from '../api/submitWorkEntry';

function failed(title: string) {
  return (error: Error) => notifications.show({ color: 'red', title, message: error.message });
}

interface EntryRowActionsProps {
  entry: WorkEntryDto;
  /** Owners and partners approve and reopen, and look after anyone's drafts. */
  approver: boolean;
  /** The signed-in member ran this entry. */
  mine: boolean;
}

/** Only the step the entry's state allows; the server refuses the rest anyway. */
export function EntryRowActions({ entry, approver, mine }: EntryRowActionsProps) {
  const approve = useApproveWorkEntry();
  const reopen = useReopenWorkEntry();
  const submit = useSubmitWorkEntry();
  const version = { id: entry.id, version: entry.version };
  const what = `the entry of ${entry.workDate} on ${entry.fieldName}`;
  const mayChange = approver || mine;

  return (
    <Group gap={4} wrap="nowrap">
      {approver && entry.state === 'submitted' && (
        <Tooltip label="Approve">
          <ActionIcon size="xl" variant="subtle" aria-label={`Approve ${what}`} loading={approve.isPending} onClick={() => approve.mutate(version, { onError: failed('Not approved') })}>
            <IconCircleCheck />
          </ActionIcon>
        </Tooltip>
      )}
      {approver && entry.state === 'approved' && (
        <Tooltip label="Reopen to change it">
          <ActionIcon size="xl" variant="subtle" color="clay" aria-label={`Reopen ${what}`} loading={reopen.isPending} onClick={() => reopen.mutate(version, { onError: failed('Not reopened') })}>
            <IconArrowBackUp />
          </ActionIcon>
        </Tooltip>
      )}
      {mayChange && entry.state === 'draft' && (
        <Tooltip label="Submit for approval">
          <ActionIcon size="xl" variant="subtle" aria-label={`Submit ${what}`} loading={submit.isPending} onClick={() => submit.mutate(version, { onError: failed('Not submitted') })}>
            <IconSend />
          </ActionIcon>
        </Tooltip>
      )}
      {mayChange && (entry.state === 'draft' || entry.state === 'submitted') && (
        <Tooltip label="Change">
          <ActionIcon size="xl" variant="subtle" component={Link} to={paths.work.editEntry(entry.id)} aria-label={`Change ${what}`}>
            <IconPencil />
          </ActionIcon>
        </Tooltip>
      )}
      {mayChange && entry.state !== 'draft' && entry.state !== 'submitted' && (
        <Tooltip label="Open with its photos">
          <ActionIcon size="xl" variant="subtle" component={Link} to={paths.work.editEntry(entry.id)} aria-label={`Open ${what}`}>
            <IconEye />
          </ActionIcon>
        </Tooltip>
      )}
    </Group>
  );
}
