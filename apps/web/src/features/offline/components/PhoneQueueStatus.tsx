import type { ReactNode } from 'react';
import { Alert, Button, Group, Progress, Stack, Text } from '@mantine/core';
import { useNetwork } from '@mantine/hooks';
import { IconAlertTriangle, IconCloudOff, IconDeviceMobile, IconSend } from '@tabler/icons-react';
import type { QueuedEntry } from '../entryQueue';
import { photoBudgetLine } from '../photoBudget';
import { photoBytesWaiting, sendWaiting, usePhoneQueue } from '../phoneQueue';

/** The server's own words on the first field it marked say more than its general message. */
function refusalLine(entry: QueuedEntry): string {
  return entry.issues[0]?.message ?? entry.reason ?? 'The server did not accept it.';
}

export function waitingLabel(count: number): string {
  return `Saved on this phone — ${count} waiting`;
}

/**
 * The queue in one line for the shell and the cab form: how many entries wait, the send under
 * way, and what the server refused. Says nothing when there is nothing on the phone and signal.
 */
export function PhoneQueueStatus({ linkToLogPage }: { linkToLogPage?: (label: string) => ReactNode }) {
  const { userId, entries, progress, stopped } = usePhoneQueue();
  const { online } = useNetwork();
  const waiting = entries.filter((e) => e.state === 'waiting').length;
  const refused = entries.filter((e) => e.state === 'refused');
  if (!userId || (online && entries.length === 0 && !progress)) return null;

  if (entries.length === 0 && !progress) {
    return (
      <Alert color="slate" variant="light" icon={<IconCloudOff />} mb="md" data-testid="queue-status">
        No signal. Entries you log are kept on this phone and sent when the signal is back.
      </Alert>
    );
  }

  return (
    <Stack gap="xs" mb="md" data-testid="queue-status">
      {(waiting > 0 || progress) && (
        <Alert color="harbor" variant="light" icon={<IconDeviceMobile />} title={waitingLabel(waiting)} data-testid="queue-waiting">
          <Stack gap="xs">
            {progress && progress.total > 0 ? (
              <>
                <Text size="sm" data-testid="queue-progress">
                  Sending {Math.min(progress.done + 1, progress.total)} of {progress.total}…
                </Text>
                <Progress value={(progress.done / progress.total) * 100} aria-label="Sending progress" />
              </>
            ) : (
              <Text size="sm">
                {!online ? 'No signal: they go to the office once the phone is back in range.' : (stopped?.message ?? 'They are sent in the order they were logged.')}
              </Text>
            )}
            {photoBytesWaiting(entries) > 0 && (
              <Text size="sm" c="dimmed" data-testid="queue-photo-budget">
                {photoBudgetLine(photoBytesWaiting(entries))}
              </Text>
            )}
            <Group gap="sm">
              <Button size="md" leftSection={<IconSend size={18} />} disabled={!online || Boolean(progress)} onClick={() => void sendWaiting(userId)}>
                Send now
              </Button>
              {linkToLogPage?.('See them')}
            </Group>
          </Stack>
        </Alert>
      )}
      {refused.length > 0 && (
        <Alert color="red" variant="light" icon={<IconAlertTriangle />} title={`${refused.length} not accepted by the server`} data-testid="queue-refused">
          <Text size="sm">
            {refusalLine(refused[0]!)}
            {refused.length > 1 ? ` (and ${refused.length - 1} more)` : ''} Fix or delete {refused.length === 1 ? 'it' : 'them'}; nothing is sent until then.
          </Text>
          {linkToLogPage?.('Fix on the log page')}
        </Alert>
      )}
    </Stack>
  );
}
