import { forwardRef, type ComponentPropsWithoutRef } from 'react';
import { Avatar, Group, Text, UnstyledButton } from '@mantine/core';
import type { SessionUser } from '@hitchbook/shared/schemas/auth';
import { IconChevronDown } from '@tabler/icons-react';

function initials(name: string): string {
  const parts = name.trim().split(/\s+/);
  return ((parts[0]?.[0] ?? '') + (parts.length > 1 ? (parts[parts.length - 1]?.[0] ?? '') : '')).toUpperCase();
}

type AccountButtonProps = { user: SessionUser } & Omit<ComponentPropsWithoutRef<'button'>, 'color' | 'style'>;

/** The header's account button: the same whether the menu behind it has loaded yet or not. */
export const AccountButton = forwardRef<HTMLButtonElement, AccountButtonProps>(function AccountButton({ user, ...others }, ref) {
  return (
    <UnstyledButton ref={ref} aria-label="Your account" data-testid="user-menu" mih={48} px={4} {...others}>
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
  );
});
