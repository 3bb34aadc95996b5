import type { ReactNode } from 'react';
import { Group, Paper, Stack, Text, ThemeIcon, Title } from '@mantine/core';
import { IconCheck } from '@tabler/icons-react';
import type { WorkEntryWithWarnings } from '@hitchbook/shared/schemas/work-entries';
import { formatQuantity } from '../quantity';
import { EntryWarnings } from './EntryWarnings';

/** What was stored, in a line an operator can check at a glance, with the server's second looks. */
export function SavedEntryPanel({ entry, children }: { entry: WorkEntryWithWarnings; children: ReactNode }) {
  const machines = [entry.powerMachineName, entry.implementMachineName].filter(Boolean).join(' + ');
  return (
    <Stack gap="md" data-testid="entry-saved">
      <Paper withBorder radius="md" p="md">
        <Group gap="md" wrap="nowrap" align="flex-start">
          <ThemeIcon size={48} radius="xl" color="harbor">
            <IconCheck size={30} />
          </ThemeIcon>
          <Stack gap={4}>
            <Title order={2} size="h3">
              {entry.state === 'submitted' ? 'Submitted for approval' : entry.state === 'draft' ? 'Saved as a draft' : 'Saved'}
            </Title>
            <Text size="lg">
              {entry.workDate}: {entry.workTypeName} on {entry.fieldName}
            </Text>
            <Text size="lg" fw={700}>
              {formatQuantity(entry.hours, 2)} h{entry.acres ? ` · ${formatQuantity(entry.acres, 2)} ac` : ''}
              {entry.miles ? ` · ${formatQuantity(entry.miles, 2)} mi` : ''}
            </Text>
            {machines && <Text c="dimmed">{machines}</Text>}
          </Stack>
        </Group>
      </Paper>
      <EntryWarnings warnings={entry.warnings} />
      {children}
    </Stack>
  );
}
