import { Center, Loader, Stack, Text } from '@mantine/core';

export function FullPageLoader({ label = 'Loading Hitchbook…' }: { label?: string }) {
  return (
    <Center mih="100dvh">
      <Stack align="center" gap="sm">
        <Loader size="lg" />
        <Text c="dimmed">{label}</Text>
      </Stack>
    </Center>
  );
}
