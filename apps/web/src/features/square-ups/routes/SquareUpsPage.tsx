import { useState } from 'react';
import { Anchor, Button, Paper, Skeleton, Table, Text } from '@mantine/core';
import { IconPlus } from '@tabler/icons-react';
import { Link } from 'react-router-dom';
import { formatMoney } from '@hitchbook/shared/money';
import { EmptyState } from '../../../components/EmptyState';
import { PageHeader } from '../../../components/PageHeader';
import { QueryError } from '../../../components/QueryError';
import { accessTo } from '../../../lib/areas';
import { useSessionUserOrThrow } from '../../../lib/auth';
import { paths } from '../../../lib/paths';
import { useSquareUps } from '../api/listSquareUps';
import { NewPeriodModal } from '../components/NewPeriodModal';
import { StatusBadge } from '../components/StatusBadge';


function PeriodsTable() {
  const periods = useSquareUps();
  if (periods.isError) return <QueryError error={periods.error} onRetry={() => void periods.refetch()} />;
  if (periods.isPending) return <Skeleton h={180} />;
  if (periods.data.items.length === 0) {
    return (
      <EmptyState title="No square-up periods yet">
        Open a period for a season or a year to see what each household paid, owes and is owed.
      </EmptyState>
    );
  }
  return (
    <Table.ScrollContainer minWidth={640}>
      <Table verticalSpacing="sm" highlightOnHover data-testid="periods-table">
        <Table.Thead>
          <Table.Tr>
            <Table.Th>Period</Table.Th>
            <Table.Th>Dates</Table.Th>
            <Table.Th>Status</Table.Th>
            <Table.Th ta="right">Owed between households</Table.Th>
            <Table.Th ta="right">Transfers paid</Table.Th>
          </Table.Tr>
        </Table.Thead>
        <Table.Tbody>
          {periods.data.items.map((p) => (
            <Table.Tr key={p.id}>
              <Table.Td>
                <Anchor component={Link} to={paths.squareUp(p.id)} fw={700}>
                  {p.name}
                </Anchor>
              </Table.Td>
              <Table.Td>
                {p.periodFrom} to {p.periodTo}
              </Table.Td>
              <Table.Td>
                <StatusBadge status={p.status} />
              </Table.Td>
              {/* Only a closed period has a frozen figure; an open one changes with every entry. */}
              <Table.Td ta="right">{p.positiveBalances === null ? <Text c="dimmed">Open the statement</Text> : formatMoney(p.positiveBalances)}</Table.Td>
              <Table.Td ta="right">{p.status === 'closed' ? `${p.transfersPaid} of ${p.transfers}` : '—'}</Table.Td>
            </Table.Tr>
          ))}
        </Table.Tbody>
      </Table>
    </Table.ScrollContainer>
  );
}

export function Component() {
  const user = useSessionUserOrThrow();
  const canManage = accessTo(user.role, 'squareUps') === 'manage';
  const [creating, setCreating] = useState(false);
  return (
    <>
      <PageHeader
        title="Square-up"
        description="Who paid what for the shared machines, each household's share and use, and who pays whom to settle."
        actions={
          canManage && (
            <Button leftSection={<IconPlus size={18} />} onClick={() => setCreating(true)}>
              New period
            </Button>
          )
        }
      />
      <Paper withBorder radius="md" p="md">
        <PeriodsTable />
      </Paper>
      {canManage && <NewPeriodModal opened={creating} onClose={() => setCreating(false)} />}
    </>
  );
}
