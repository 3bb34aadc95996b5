import { Group, Text } from '@mantine/core';

function BrandMark() {
  return (
    <svg width="32" height="32" viewBox="0 0 64 64" aria-hidden="true">
      <rect width="64" height="64" rx="14" fill="#f3ded2" />
      <path d="M16 44V20h6v9h20v-9h6v24h-6v-9H22v9z" fill="#1c5058" />
      <circle cx="32" cy="46" r="5" fill="#cc6b38" />
    </svg>
  );
}

/** The mark and the name, for the header's dark band. */
export function BrandLockup() {
  return (
    <Group gap={8} wrap="nowrap">
      <BrandMark />
      <Text fw={700} size="lg" c="white">
        Hitchbook
      </Text>
    </Group>
  );
}
