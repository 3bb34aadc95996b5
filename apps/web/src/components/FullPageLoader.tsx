import { Center, Loader, Stack, Text } from '@mantine/core';

export function FullPageLoader() {
  return (
    <Center mih="100dvh">
      <Stack align="center" gap="sm">
        <Loader size="lg" />
        <Text c="dimmed">Loading Hitchbook…</Text>
      </Stack>
    </Center>
  );
}
