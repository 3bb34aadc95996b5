import { Anchor, Box, Button, Group, MantineProvider, Text } from '@mantine/core';
import { IconList } from '@tabler/icons-react';
import { DatabaseDownNotice } from '../../components/DatabaseDownNotice';
import { PhoneQueueSync } from '../../features/offline/components/PhoneQueueSync';
import { LogWorkPanel } from '../../features/work/components/LogWorkPanel';
import type { SessionUser } from '@hitchbook/shared/schemas/auth';
import { accessTo } from '../../lib/areas';
import { AuthProvider, useAuth } from '../../lib/auth';
import { paths } from '../../lib/paths';
import { theme } from '../../theme';
import { ErrorBoundary } from '../ErrorBoundary';
import { BrandLockup } from '../layout/BrandLockup';

/**
 * The cab page: the work-entry form opened straight from the phone's home screen, with a header and
 * nothing else. It leaves out the office app's router, query cache, navigation and form library, which
 * together weigh more than the form; every other page is one tap away, as a page load.
 */
function CabFrame() {
  const { user, signOut } = useAuth();
  if (!user) {
    // The session ended while the page was open: sign in again and come back here.
    window.location.replace(paths.signIn({ next: paths.work.log() }));
    return null;
  }
  return (
    <Box mih="100dvh" bg="slate.0">
      <Box component="header" bg="harbor.9" c="white" h={64} px="md">
        <Group h="100%" justify="space-between" wrap="nowrap">
          <Group gap="sm" wrap="nowrap" miw={0}>
            <Anchor href={paths.dashboard()} underline="never" aria-label="Hitchbook home">
              <BrandLockup />
            </Anchor>
            <Text fw={700} c="harbor.1" truncate data-testid="operation-name">
              {user.operationName}
            </Text>
          </Group>
          <Anchor href={paths.dashboard()} c="white" fw={700} data-testid="cab-menu">
            Menu
          </Anchor>
        </Group>
      </Box>
      <Box component="main" p={{ base: 'sm', sm: 'lg' }}>
        <DatabaseDownNotice />
        <PhoneQueueSync userId={user.id} />
        <ErrorBoundary>
          <LogWorkPanel
            user={user}
            seeEntries={
              <Button size="xl" variant="default" component="a" href={paths.work.entries()} leftSection={<IconList />}>
                See the entries
              </Button>
            }
          />
        </ErrorBoundary>
        {/* A phone in a shared cab changes hands: whoever leaves signs out here, and their queue waits for them. */}
        <Group maw={720} mt="xl" justify="space-between" wrap="wrap" gap="sm">
          <Text c="dimmed">Signed in as {user.name}</Text>
          <Button
            variant="default"
            size="md"
            data-testid="cab-sign-out"
            onClick={() => void signOut().finally(() => window.location.replace(paths.signIn()))}
          >
            Sign out
          </Button>
        </Group>
      </Box>
    </Box>
  );
}

/** Whoever may log work gets the cab page; anyone else the office app, which says what they may do. */
export function mayUseCabPage(user: SessionUser): boolean {
  return accessTo(user.role, 'work') === 'manage';
}

export function CabApp() {
  return (
    <MantineProvider theme={theme} defaultColorScheme="light">
      <AuthProvider>
        <CabFrame />
      </AuthProvider>
    </MantineProvider>
  );
}
