import { useState } from 'react';
import { ActionIcon, Badge, Button, Group, Stack, Text, Tooltip } from '@mantine/core';
import { IconShieldCog, IconUserMinus, IconUserPlus } from '@tabler/icons-react';
import type { MRT_ColumnDef } from 'mantine-react-table';
import { EmptyState } from '../../../components/EmptyState';
import { PageHeader } from '../../../components/PageHeader';
import { ServerTable } from '../../../components/ServerTable';
import { accessTo } from '../../../lib/areas';
import { useSessionUserOrThrow } from '../../../lib/auth';
import { useListParams } from '../../../lib/listParams';
import { ROLE_LABELS } from '../../../lib/roleLabels';
import { useUsers, type Member } from '../api/listUsers';
import { ChangeRoleModal } from '../components/ChangeRoleModal';
import { InviteUserModal } from '../components/InviteUserModal';
import { RemoveMemberModal } from '../components/RemoveMemberModal';

const columns: MRT_ColumnDef<Member>[] = [
  {
    accessorKey: 'name',
    header: 'Name',
    enableSorting: false,
    Cell: ({ row }) => (
      <Stack gap={0}>
        <Text fw={700}>{row.original.name}</Text>
        <Text size="sm" c="dimmed">
          {row.original.email}
        </Text>
      </Stack>
    ),
  },
  {
    accessorKey: 'role',
    header: 'Role',
    enableSorting: false,
    Cell: ({ row }) => (
      <Badge variant="light" size="lg" color="harbor">
        {ROLE_LABELS[row.original.role]}
      </Badge>
    ),
  },
  {
    accessorKey: 'partyName',
    header: 'Household or customer',
    enableSorting: false,
    Cell: ({ row }) => row.original.partyName ?? '—',
  },
  {
    accessorKey: 'status',
    header: 'Status',
    enableSorting: false,
    Cell: ({ row }) =>
      row.original.status === 'invited' ? (
        <Badge color="clay" variant="outline" size="lg">
          Invited
        </Badge>
      ) : (
        <Badge color="slate" variant="outline" size="lg">
          Active
        </Badge>
      ),
  },
];

export function Component() {
  const user = useSessionUserOrThrow();
  const canManage = accessTo(user.role, 'users') === 'manage';
  const { params, update } = useListParams();
  const users = useUsers(params);
  const [inviting, setInviting] = useState(false);
  const [changing, setChanging] = useState<Member | null>(null);
  const [removing, setRemoving] = useState<Member | null>(null);

  return (
    <>
      <PageHeader
        title="Users"
        description="Everyone who can sign in to this operation, and what their role lets them do."
        actions={
          canManage && (
            <Button leftSection={<IconUserPlus size={20} />} onClick={() => setInviting(true)}>
              Invite someone
            </Button>
          )
        }
      />
      <ServerTable
        columns={columns}
        query={users}
        params={params}
        onParamsChange={update}
        getRowId={(member) => member.membershipId}
        rowActions={
          canManage
            ? (member) =>
                // Nobody changes or removes their own sign-in here, so an owner cannot lock themself out.
                member.userId === user.id ? null : (
                  <Group gap={4} wrap="nowrap">
                    <Tooltip label="Change role">
                      <ActionIcon
                        variant="subtle"
                        size="xl"
                        aria-label={`Change role of ${member.name}`}
                        onClick={() => setChanging(member)}
                      >
                        <IconShieldCog />
                      </ActionIcon>
                    </Tooltip>
                    <Tooltip label="Remove">
                      <ActionIcon
                        variant="subtle"
                        color="red"
                        size="xl"
                        aria-label={`Remove ${member.name}`}
                        onClick={() => setRemoving(member)}
                      >
                        <IconUserMinus />
                      </ActionIcon>
                    </Tooltip>
                  </Group>
                )
            : undefined
        }
        emptyState={<EmptyState title="No one else yet">Invite the households, operators and bookkeeper.</EmptyState>}
      />
      <InviteUserModal opened={inviting} onClose={() => setInviting(false)} />
      <ChangeRoleModal member={changing} onClose={() => setChanging(null)} />
      <RemoveMemberModal member={removing} onClose={() => setRemoving(null)} />
    </>
  );
}
