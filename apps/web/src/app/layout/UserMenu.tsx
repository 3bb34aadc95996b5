import { Menu, Text } from '@mantine/core';
import type { SessionUser } from '@hitchbook/shared/schemas/auth';
import { IconLogout, IconUserCircle } from '@tabler/icons-react';
import { Link, useNavigate } from 'react-router-dom';
import { useAuth } from '../../lib/auth';
import { paths } from '../../lib/paths';
import { ROLE_LABELS } from '../../lib/roleLabels';
import { AccountButton } from './AccountButton';

export default function UserMenu({ user, defaultOpened }: { user: SessionUser; defaultOpened: boolean }) {
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
    <Menu position="bottom-end" width={260} shadow="md" defaultOpened={defaultOpened}>
      <Menu.Target>
        <AccountButton user={user} />
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
