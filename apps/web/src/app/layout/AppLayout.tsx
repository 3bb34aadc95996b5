import { lazy, Suspense, useEffect, useState } from 'react';
import { Anchor, AppShell, Burger, Group, Skeleton, Text } from '@mantine/core';
import { useDisclosure } from '@mantine/hooks';
import { QueryClientProvider } from '@tanstack/react-query';
import { Link, useLocation } from 'react-router-dom';
import { DatabaseDownNotice } from '../../components/DatabaseDownNotice';
import { NotAllowed } from '../../components/NotAllowed';
import { NotFound } from '../../components/NotFound';
import { PhoneQueueStatus } from '../../features/offline/components/PhoneQueueStatus';
import { PhoneQueueSync } from '../../features/offline/components/PhoneQueueSync';
import type { SessionUser } from '@hitchbook/shared/schemas/auth';
import { useAfterFirstPaint } from '../../lib/afterFirstPaint';
import { useSessionUserOrThrow } from '../../lib/auth';
import { paths } from '../../lib/paths';
import { queryClient } from '../../lib/queryClient';
import { RouteErrorBoundary, type Refusals } from '../RouteErrorBoundary';
import { SignedInRoutes } from '../signedInRoutes';
import { AccountButton } from './AccountButton';
import { Brand } from './Brand';
import { MainNav } from './MainNav';

const REFUSALS: Refusals = { notAllowed: <NotAllowed />, notFound: <NotFound /> };

// Both only matter once someone taps or saves, and both bring positioning and transition code of their
// own: they load right after the page is drawn, so the cab form shows without waiting for them.
const UserMenu = lazy(() => import('./UserMenu'));
const Notifications = lazy(() => import('@mantine/notifications').then((module) => ({ default: module.Notifications })));

function AccountMenu({ user }: { user: SessionUser }) {
  const painted = useAfterFirstPaint();
  // A tap before the menu has loaded is not lost: the menu opens as soon as it arrives.
  const [tapped, setTapped] = useState(false);
  const placeholder = <AccountButton user={user} onClick={() => setTapped(true)} />;
  if (!painted && !tapped) return placeholder;
  return (
    <Suspense fallback={placeholder}>
      <UserMenu user={user} defaultOpened={tapped} />
    </Suspense>
  );
}

/**
 * The signed-in frame: header with the operation and user menu, role-shaped navigation. It brings the
 * query cache and the toasts, which only signed-in pages use, so the sign-in page loads neither.
 */
export default function AppLayout() {
  const user = useSessionUserOrThrow();
  const location = useLocation();
  const [navOpened, nav] = useDisclosure(false);
  const closeNav = nav.close;
  const painted = useAfterFirstPaint();

  // On a phone the navigation covers the page, so it closes once a link is followed.
  useEffect(() => closeNav(), [location.pathname, closeNav]);

  return (
    <QueryClientProvider client={queryClient}>
      {painted && (
        <Suspense fallback={null}>
          <Notifications position="top-center" />
        </Suspense>
      )}
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
            <AccountMenu user={user} />
          </Group>
        </AppShell.Header>

        <AppShell.Navbar p="sm" aria-label="Main navigation">
          <MainNav role={user.role} operationName={user.operationName} />
        </AppShell.Navbar>

        <AppShell.Main bg="slate.0">
          <DatabaseDownNotice />
          <PhoneQueueSync userId={user.id} />
          {/* The cab form shows the queue itself, beside the entries it lists. */}
          {location.pathname !== paths.work.log() && (
            <PhoneQueueStatus
              linkToLogPage={(label) => (
                <Anchor component={Link} to={paths.work.log()} size="sm">
                  {label}
                </Anchor>
              )}
            />
          )}
          <RouteErrorBoundary refusals={REFUSALS}>
            <Suspense fallback={<Skeleton h={320} maw={720} />}>
              <SignedInRoutes />
            </Suspense>
          </RouteErrorBoundary>
        </AppShell.Main>
      </AppShell>
    </QueryClientProvider>
  );
}
