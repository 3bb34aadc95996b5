import type { ReactNode } from 'react';
import { Group, Stack, Text } from '@mantine/core';

export interface Fact {
  label: string;
  value: ReactNode;
  hint?: string;
}

/** Label-and-value rows that stay readable on a phone: the value wraps under its label. */
export function FactList({ facts }: { facts: Fact[] }) {
  return (
    <Stack gap="sm">
      {facts.map((fact) => (
        <Stack key={fact.label} gap={2}>
          <Group justify="space-between" gap="xs" wrap="wrap">
            <Text c="dimmed" size="sm">
              {fact.label}
            </Text>
            <Text fw={700} ta="right">
              {fact.value}
            </Text>
          </Group>
          {fact.hint && (
            <Text size="xs" c="dimmed">
              {fact.hint}
            </Text>
          )}
        </Stack>
      ))}
    </Stack>
  );
}
