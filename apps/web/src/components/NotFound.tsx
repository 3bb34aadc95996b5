import { Button, Stack, Text, ThemeIcon, Title } from '@mantine/core';
import { IconMapPinOff } from '@tabler/icons-react';
import { Link } from 'react-router-dom';
import { paths } from '../lib/paths';

export function NotFound() {
  return (
    <Stack align="center" gap="sm" py={64} ta="center" data-testid="not-found">
      <ThemeIcon size={64} radius="xl" variant="light" color="slate">
        <IconMapPinOff size={34} />
      </ThemeIcon>
      <Title order={1} size="h2">
        Page not found
      </Title>
      <Text c="dimmed" maw={460}>
        There is nothing at this address. The link may be old, or the page may have moved.
      </Text>
      <Button component={Link} to={paths.dashboard()}>
        Back to the dashboard
      </Button>
    </Stack>
  );
}
