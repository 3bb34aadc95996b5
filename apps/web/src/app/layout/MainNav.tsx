import { Box, NavLink, Stack, Text } from '@mantine/core';
import type { Role } from '@hitchbook/shared/roles';
import { Link, useLocation } from 'react-router-dom';
import {
  IconCalculator,
  IconChartBar,
  IconClipboardList,
  IconFileInvoice,
  IconGauge,
  IconHistory,
  IconMap2,
  IconScale,
  IconTags,
  IconTractor,
  IconUserCircle,
  IconUsers,
  IconUsersGroup,
  type Icon,
} from '@tabler/icons-react';
import { areasFor, type Area, type AreaKey } from '../../lib/areas';

const AREA_ICONS: Record<AreaKey, Icon> = {
  dashboard: IconGauge,
  work: IconClipboardList,
  machines: IconTractor,
  fields: IconMap2,
  squareUps: IconScale,
  yearEnd: IconChartBar,
  invoices: IconFileInvoice,
  rates: IconTags,
  estimates: IconCalculator,
  parties: IconUsersGroup,
  users: IconUsers,
  audit: IconHistory,
  myInvoices: IconFileInvoice,
  account: IconUserCircle,
};

function isActive(pathname: string, href: string): boolean {
  return href === '/' ? pathname === '/' : pathname === href || pathname.startsWith(`${href}/`);
}

/** The current page's link says so to screen readers; the plain router link keeps the sign-in page's router code small. */
function currentPage(pathname: string, href: string): 'page' | undefined {
  return isActive(pathname, href) ? 'page' : undefined;
}

function AreaLink({ area, pathname }: { area: Area; pathname: string }) {
  const Icon = AREA_ICONS[area.key as AreaKey];
  const links = area.links ?? [];
  const inArea = isActive(pathname, area.href) || links.some((l) => isActive(pathname, l.href));
  if (links.length === 0) {
    return (
      <NavLink
        component={Link}
        to={area.href}
        aria-current={currentPage(pathname, area.href)}
        label={area.label}
        leftSection={<Icon size={24} stroke={1.7} />}
        active={inArea}
        h={52}
        fw={600}
        style={{ borderRadius: 'var(--mantine-radius-md)' }}
      />
    );
  }
  return (
    <NavLink
      label={area.label}
      leftSection={<Icon size={24} stroke={1.7} />}
      defaultOpened
      childrenOffset={36}
      h={52}
      fw={600}
      style={{ borderRadius: 'var(--mantine-radius-md)' }}
    >
      {links.map((link) => (
        <NavLink
          key={link.href}
          component={Link}
          to={link.href}
          aria-current={currentPage(pathname, link.href)}
          label={link.label}
          active={isActive(pathname, link.href)}
          h={48}
          style={{ borderRadius: 'var(--mantine-radius-md)' }}
        />
      ))}
    </NavLink>
  );
}

export function MainNav({ role, operationName }: { role: Role; operationName: string }) {
  const { pathname } = useLocation();
  return (
    // The browser's own scrolling: a long navigation on a short phone scrolls like any page.
    <Box h="100%" style={{ overflowY: 'auto' }}>
      <Text hiddenFrom="xs" fw={700} c="harbor.8" px="sm" pb="xs">
        {operationName}
      </Text>
      <Stack gap={4} component="nav" data-testid="main-nav">
        {areasFor(role).map((area) => (
          <AreaLink key={area.key} area={area} pathname={pathname} />
        ))}
      </Stack>
    </Box>
  );
}
