import { useState } from 'react';
import { Badge, Button, Group, List, Paper, Stack, Text, Title } from '@mantine/core';
import { IconPencil, IconTrash } from '@tabler/icons-react';
import type { EntryOptions } from '../../work/components/EntryFields';
import type { QueuedEntry } from '../entryQueue';
import { deleteQueuedEntry, usePhoneQueue } from '../phoneQueue';
import { QueuedEntryForm } from './QueuedEntryForm';

function timingLine(entry: QueuedEntry): string {
  const p = entry.payload;
  if (p.meterEnd) return `Meter ${p.meterStart ?? '?'} → ${p.meterEnd}`;
  if (p.hours) return `${p.hours} h`;
  return 'Clock times';
}

function entryTitle(entry: QueuedEntry, options: EntryOptions | null): string {
  const field = options?.fields.find((f) => f.id === entry.payload.fieldId)?.name ?? 'a field';
  const workType = options?.workTypes.find((w) => w.id === entry.payload.workTypeId)?.name ?? 'Work';
  return `${entry.payload.workDate}: ${workType} on ${field}`;
}

/** The entries still on this phone, oldest first; a refused one can be fixed or deleted here. */
export function PhoneQueueList({ options, operatorName }: { options: EntryOptions | null; operatorName: string }) {
  const { entries, progress } = usePhoneQueue();
  const [fixing, setFixing] = useState<string | null>(null);
  const [confirming, setConfirming] = useState<string | null>(null);
  if (entries.length === 0) return null;

  return (
    <Stack gap="sm" mb="lg" data-testid="phone-queue">
      <Title order={2} size="h4">
        On this phone
      </Title>
      {entries.map((entry) => (
        <Paper key={entry.clientId} withBorder radius="md" p="md" data-testid="queued-entry" data-client-id={entry.clientId}>
          <Stack gap="xs">
            <Group justify="space-between" wrap="nowrap" align="flex-start">
              <Stack gap={2}>
                <Text fw={700}>{entryTitle(entry, options)}</Text>
                <Text size="sm" c="dimmed">
                  {timingLine(entry)}
                  {entry.payload.notes ? ` · ${entry.payload.notes}` : ''}
                  {entry.photos.length > 0 ? ` · ${entry.photos.length} photo${entry.photos.length === 1 ? '' : 's'}` : ''}
                </Text>
              </Stack>
              {entry.state === 'refused' ? <Badge color="red" style={{ flexShrink: 0 }}>Not accepted</Badge> : <Badge color="harbor" style={{ flexShrink: 0 }}>Waiting</Badge>}
            </Group>
            {entry.state === 'refused' && (
              <>
                <Text size="sm" c="red.8" data-testid="queued-reason">
                  {entry.reason}
                </Text>
                {entry.issues.length > 0 && (
                  <List size="sm" c="red.8">
                    {entry.issues.map((issue) => (
                      <List.Item key={`${issue.path}:${issue.message}`}>{issue.message}</List.Item>
                    ))}
                  </List>
                )}
              </>
            )}
            {fixing === entry.clientId && options ? (
              <QueuedEntryForm entry={entry} options={options} operatorName={operatorName} onDone={() => setFixing(null)} />
            ) : (
              <Group gap="sm">
                {entry.state === 'refused' && !entry.entryStored && options && (
                  <Button variant="light" leftSection={<IconPencil size={18} />} onClick={() => setFixing(entry.clientId)}>
                    Fix
                  </Button>
                )}
                {confirming === entry.clientId ? (
                  <>
                    <Text size="sm">
                      {entry.entryStored
                        ? 'Drop its photos from the phone? The entry itself is already at the office.'
                        : 'Delete this entry from the phone? The office never got it.'}
                    </Text>
                    <Button color="red" onClick={() => void deleteQueuedEntry(entry.userId, entry.clientId).then(() => setConfirming(null))}>
                      Delete it
                    </Button>
                    <Button variant="default" onClick={() => setConfirming(null)}>
                      Keep it
                    </Button>
                  </>
                ) : (
                  <Button variant="subtle" color="red" leftSection={<IconTrash size={18} />} disabled={Boolean(progress)} onClick={() => setConfirming(entry.clientId)}>
                    {entry.entryStored ? 'Drop the photos' : 'Delete'}
                  </Button>
                )}
              </Group>
            )}
          </Stack>
        </Paper>
      ))}
    </Stack>
  );
}
