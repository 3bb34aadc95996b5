import type { ReactNode } from 'react';
import { Stack, Text, ThemeIcon, Title } from '@mantine/core';
import { IconInbox } from '@tabler/icons-react';

interface EmptyStateProps {
  title: string;
  children?: ReactNode;
}

export function EmptyState({ title, children }: EmptyStateProps) {
  return (
    <Stack align="center" gap="xs" py="xl" px="md" ta="center">
      <ThemeIcon size={56} radius="xl" variant="light" color="slate">
        <IconInbox size={30} />
      </ThemeIcon>
      <Title order={3} size="h4">
        {title}
      </Title>
      {children && (
        <Text c="dimmed" maw={420}>
          {children}
        </Text>
      )}
    </Stack>
  );
}
