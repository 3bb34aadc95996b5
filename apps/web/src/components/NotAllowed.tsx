import { Button, Stack, Text, ThemeIcon, Title } from '@mantine/core';
import { IconLock } from '@tabler/icons-react';
import { Link } from 'react-router-dom';
import { paths } from '../lib/paths';

export function NotAllowed() {
  return (
    <Stack align="center" gap="sm" py={64} ta="center" data-testid="not-allowed">
      <ThemeIcon size={64} radius="xl" variant="light" color="clay">
        <IconLock size={34} />
      </ThemeIcon>
      <Title order={1} size="h2">
        Not available for your role
      </Title>
      <Text c="dimmed" maw={460}>
        This part of Hitchbook is not open to your sign-in. If you think you need it, ask the owner of the account to
        change your role.
      </Text>
      <Button component={Link} to={paths.dashboard()}>
        Back to the dashboard
      </Button>
    </Stack>
  );
}
