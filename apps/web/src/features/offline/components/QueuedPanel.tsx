import type { ReactNode } from 'react';
import { Group, Paper, Stack, Text, ThemeIcon, Title } from '@mantine/core';
import { IconDeviceMobile } from '@tabler/icons-react';
import { usePhoneQueue } from '../phoneQueue';
import { waitingLabel } from './PhoneQueueStatus';

/** After a save without signal: the entry is safe on the phone and will go by itself. */
export function QueuedPanel({ children }: { children: ReactNode }) {
  const { entries } = usePhoneQueue();
  const waiting = entries.filter((e) => e.state === 'waiting').length;
  return (
    <Stack gap="md" data-testid="entry-queued">
      <Paper withBorder radius="md" p="md">
        <Group gap="md" wrap="nowrap" align="flex-start">
          <ThemeIcon size={48} radius="xl" color="harbor">
            <IconDeviceMobile size={30} />
          </ThemeIcon>
          <Stack gap={4}>
            <Title order={2} size="h3">
              {waiting > 0 ? waitingLabel(waiting) : 'Saved on this phone'}
            </Title>
            <Text size="lg">It goes to the office by itself once the phone has signal, in the order it was logged.</Text>
          </Stack>
        </Group>
      </Paper>
      {children}
    </Stack>
  );
}
