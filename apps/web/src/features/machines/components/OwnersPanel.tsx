import { useState } from 'react';
import { Badge, Button, Group, Paper, Skeleton, Stack, Table, Text, Timeline, Title } from '@mantine/core';
import { IconUsersGroup } from '@tabler/icons-react';
import { QueryError } from '../../../components/QueryError';
import { useMachineShares } from '../api/getMachineShares';
import { formatSharePct } from '../shares';
import { TABULAR } from '../tabular';
import { SharesFormModal } from './SharesFormModal';

export function OwnersPanel({ machineId, canManage }: { machineId: string; canManage: boolean }) {
  const shares = useMachineShares(machineId);
  const [editing, setEditing] = useState(false);
  const current = shares.data?.current?.shares ?? [];
  // The set in force today is shown as the table; the timeline lists it and every earlier one.
  const history = shares.data?.history ?? [];

  return (
    <Paper withBorder p="md" radius="md" data-testid="owners-panel">
      <Stack gap="md">
        <Group justify="space-between">
          <Title order={2} size="h4">
            Owners
          </Title>
          {canManage && (
            <Button variant="light" leftSection={<IconUsersGroup size={18} />} onClick={() => setEditing(true)}>
              Change shares
            </Button>
          )}
        </Group>
        {shares.isPending && <Skeleton h={80} />}
        {shares.isError && <QueryError error={shares.error} onRetry={() => void shares.refetch()} />}
        {shares.data && current.length === 0 && <Text c="dimmed">No owners are set for today.</Text>}
        {current.length > 0 && (
          <Table verticalSpacing="xs" data-testid="current-owners">
            <Table.Thead>
              <Table.Tr>
                <Table.Th>Household</Table.Th>
                <Table.Th ta="right">Share</Table.Th>
              </Table.Tr>
            </Table.Thead>
            <Table.Tbody>
              {current.map((o) => (
                <Table.Tr key={o.partyId}>
                  <Table.Td>{o.name}</Table.Td>
                  <Table.Td ta="right" style={TABULAR}>
                    {formatSharePct(o.sharePct)}
                  </Table.Td>
                </Table.Tr>
              ))}
            </Table.Tbody>
          </Table>
        )}
        {history.length > 0 && (
          <Stack gap="xs">
            <Text size="sm" fw={700} c="dimmed">
              History
            </Text>
            <Timeline bulletSize={16} lineWidth={2} active={0}>
              {history.map((set) => (
                <Timeline.Item
                  key={set.effectiveFrom}
                  title={
                    <Group gap="xs">
                      <Text fw={600}>From {set.effectiveFrom}</Text>
                      {set.effectiveFrom === shares.data?.current?.effectiveFrom && (
                        <Badge size="sm" variant="light">
                          In force
                        </Badge>
                      )}
                      {set.effectiveFrom > (shares.data?.on ?? '') && (
                        <Badge size="sm" variant="light" color="clay">
                          Coming
                        </Badge>
                      )}
                    </Group>
                  }
                >
                  <Text size="sm" c="dimmed">
                    {set.shares.map((o) => `${o.name} ${formatSharePct(o.sharePct)}`).join(' · ')}
                  </Text>
                </Timeline.Item>
              ))}
            </Timeline>
          </Stack>
        )}
      </Stack>
      <SharesFormModal opened={editing} machineId={machineId} current={current} onClose={() => setEditing(false)} />
    </Paper>
  );
}
