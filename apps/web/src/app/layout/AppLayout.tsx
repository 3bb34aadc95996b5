import { useEffect } from 'react';
import { AppShell, Burger, Group, Text } from '@mantine/core';
import { useDisclosure } from '@mantine/hooks';
import { Navigate, Outlet, useLocation } from 'react-router-dom';
import { DatabaseDownNotice } from '../../components/DatabaseDownNotice';
import { PhoneQueueStatus } from '../../features/offline/components/PhoneQueueStatus';
import { PhoneQueueSync } from '../../features/offline/components/PhoneQueueSync';
import { useAuth } from '../../lib/auth';
import { paths } from '../../lib/paths';
import { Brand } from './Brand';
import { MainNav } from './MainNav';
import { UserMenu } from './UserMenu';

/** The signed-in frame: header with the operation and user menu, role-shaped navigation. */
export function AppLayout() {
  const { user } = useAuth();
  const location = useLocation();
  const [navOpened, nav] = useDisclosure(false);
  const closeNav = nav.close;

  // On a phone the navigation covers the page, so it closes once a link is followed.
  useEffect(() => closeNav(), [location.pathname, closeNav]);

  if (!user) return <Navigate to={paths.signIn({ next: location.pathname + location.search })} replace />;

  return (
    <AppShell
      header={{ height: 64 }}
      navbar={{ width: 272, breakpoint: 'sm', collapsed: { mobile: !navOpened } }}
      padding={{ base: 'sm', sm: 'lg' }}
    >
      <AppShell.Header bg="harbor.9" c="white" withBorder={false}>
        <Group h="100%" px="md" justify="space-between" wrap="nowrap">
          <Group gap="sm" wrap="nowrap" miw={0}>
            <Burger
              opened={navOpened}
              onClick={nav.toggle}
              hiddenFrom="sm"
              size="md"
              color="white"
              aria-label={navOpened ? 'Close navigation' : 'Open navigation'}
              data-testid="nav-burger"
            />
            <Brand />
            <Text fw={700} c="harbor.1" truncate visibleFrom="xs" data-testid="operation-name">
              {user.operationName}
            </Text>
          </Group>
          <UserMenu user={user} />
        </Group>
      </AppShell.Header>

      <AppShell.Navbar p="sm" aria-label="Main navigation">
        <MainNav role={user.role} operationName={user.operationName} />
      </AppShell.Navbar>

      <AppShell.Main bg="slate.0">
        <DatabaseDownNotice />
        <PhoneQueueSync userId={user.id} />
        {/* The cab form shows the queue itself, beside the entries it lists. */}
        {location.pathname !== paths.work.log() && <PhoneQueueStatus />}
        <Outlet />
      </AppShell.Main>
    </AppShell>
  );
}
