import { Avatar, Group, Menu, Text, UnstyledButton } from '@mantine/core';
import type { SessionUser } from '@hitchbook/shared/schemas/auth';
import { IconChevronDown, IconLogout, IconUserCircle } from '@tabler/icons-react';
import { Link, useNavigate } from 'react-router-dom';
import { useAuth } from '../../lib/auth';
import { paths } from '../../lib/paths';
import { ROLE_LABELS } from '../../lib/roleLabels';

function initials(name: string): string {
  const parts = name.trim().split(/\s+/);
  return ((parts[0]?.[0] ?? '') + (parts.length > 1 ? (parts[parts.length - 1]?.[0] ?? '') : '')).toUpperCase();
}

export function UserMenu({ user }: { user: SessionUser }) {
  const { signOut } = useAuth();
  const navigate = useNavigate();

  async function handleSignOut() {
    try {
      await signOut();
    } finally {
      navigate(paths.signIn(), { replace: true });
    }
  }

  return (
    <Menu position="bottom-end" width={260} shadow="md">
      <Menu.Target>
        <UnstyledButton aria-label="Your account" data-testid="user-menu" mih={48} px={4}>
          <Group gap="xs" wrap="nowrap">
            <Avatar color="clay" variant="filled" radius="xl">
              {initials(user.name)}
            </Avatar>
            <Text c="white" fw={600} visibleFrom="sm" truncate maw={180}>
              {user.name}
            </Text>
            <IconChevronDown size={18} color="white" />
          </Group>
        </UnstyledButton>
      </Menu.Target>
      <Menu.Dropdown>
        <Menu.Label>
          <Text fw={700} c="dark" size="sm">
            {user.name}
          </Text>
          <Text size="xs">{user.email}</Text>
          <Text size="xs">
            {ROLE_LABELS[user.role]} · {user.operationName}
          </Text>
        </Menu.Label>
        <Menu.Divider />
        <Menu.Item component={Link} to={paths.account()} leftSection={<IconUserCircle size={20} />} py="sm">
          Account
        </Menu.Item>
        <Menu.Item leftSection={<IconLogout size={20} />} onClick={() => void handleSignOut()} py="sm">
          Sign out
        </Menu.Item>
      </Menu.Dropdown>
    </Menu>
  );
}
