import { lazy, Suspense, useMemo, useState, type ReactNode } from 'react';
import { Accordion, Alert, Anchor, Button, Group, List, Paper, SimpleGrid, Skeleton, Stack, Text, Title } from '@mantine/core';
import { IconAlertTriangle, IconLock } from '@tabler/icons-react';
import { Link, useParams } from 'react-router-dom';
import { formatMoney } from '@hitchbook/shared/money';
import type { SquareUpStatementDto } from '@hitchbook/shared/schemas/square-ups';
import { PageHeader } from '../../../components/PageHeader';
import { QueryError } from '../../../components/QueryError';
import { accessTo } from '../../../lib/areas';
import { useSessionUserOrThrow } from '../../../lib/auth';
import { paths } from '../../../lib/paths';
import { downloadStatement } from '../api/downloadStatement';
import { useStatement } from '../api/getStatement';
import { ClosePeriodModal } from '../components/ClosePeriodModal';
import { DownloadButtons } from '../components/DownloadButtons';
import { HouseholdsTable } from '../components/HouseholdsTable';
import { LinesDrawer, type DrillDown } from '../components/LinesDrawer';
import { MachinesTable } from '../components/MachinesTable';
import { StatusBadge } from '../components/StatusBadge';
import { TransfersPanel } from '../components/TransfersPanel';
import { UseChargesTable } from '../components/UseChargesTable';

const BalanceChart = lazy(() => import('../components/BalanceChart'));


function Section({ title, children, testId }: { title: string; children: ReactNode; testId?: string }) {
  return (
    // Clipped, so a chart's hidden tooltip layer never widens the page on a phone.
    <Paper withBorder radius="md" p="md" style={{ overflow: 'hidden' }} data-testid={testId}>
      <Title order={2} size="h4" mb="sm">
        {title}
      </Title>
      {children}
    </Paper>
  );
}

function Statement({ statement, canManage, canReviewWork }: { statement: SquareUpStatementDto; canManage: boolean; canReviewWork: boolean }) {
  const { squareUp } = statement;
  const [drill, setDrill] = useState<DrillDown | null>(null);
  const [closing, setClosing] = useState(false);
  const names = useMemo(() => new Map(statement.households.map((h) => [h.householdId, h.name])), [statement.households]);
  const closed = squareUp.status === 'closed';
  return (
    <>
      <PageHeader
        title={squareUp.name}
        description={
          <Group gap="sm" component="span">
            <StatusBadge status={squareUp.status} />
            <span>
              {squareUp.periodFrom} to {squareUp.periodTo}; fixed costs split by {squareUp.fixedCostsBy === 'ownership' ? 'ownership shares' : 'use'}
            </span>
          </Group>
        }
        actions={
          <>
            <DownloadButtons
              files={[
                { label: 'CSV', download: () => downloadStatement(squareUp.id, 'csv') },
                { label: 'PDF', download: () => downloadStatement(squareUp.id, 'pdf') },
              ]}
            />
            {canManage && !closed && (
              <Button color="clay" leftSection={<IconLock size={18} />} onClick={() => setClosing(true)}>
                Close period
              </Button>
            )}
          </>
        }
      />
      <Stack gap="lg">
        {closed && (
          <Alert color="harbor" variant="light" icon={<IconLock />}>
            Closed {squareUp.closedAt?.slice(0, 10)}. These figures are frozen; corrections go into the next period.
          </Alert>
        )}
        {statement.warnings.length > 0 && (
          <Alert color="clay" variant="light" icon={<IconAlertTriangle />} title="Check before closing" data-testid="statement-warnings">
            <List size="sm">
              {statement.warnings.map((w, i) => (
                <List.Item key={`${w.code}-${i}`}>{w.message}</List.Item>
              ))}
            </List>
            {statement.pendingEntries > 0 && canReviewWork && (
              <Anchor component={Link} to={paths.work.entries({ state: 'submitted', dateFrom: squareUp.periodFrom, dateTo: squareUp.periodTo })} size="sm" fw={700} mt="xs" display="inline-block">
                Review the waiting entries →
              </Anchor>
            )}
          </Alert>
        )}
        <Section title="Households" testId="households">
          <HouseholdsTable households={statement.households} onDrill={setDrill} />
        </Section>
        <SimpleGrid cols={{ base: 1, md: 2 }} spacing="lg">
          <Section title="Balances">
            <Suspense fallback={<Skeleton h={260} />}>
              <BalanceChart households={statement.households} />
            </Suspense>
          </Section>
          <Section title="Who pays whom" testId="transfers-section">
            <Text size="sm" c="dimmed" mb="sm">
              {formatMoney(statement.totals.positiveBalances)} owed between the households, settled in the fewest transfers.
            </Text>
            <TransfersPanel squareUpId={squareUp.id} transfers={statement.transfers} closed={closed} canManage={canManage} />
          </Section>
        </SimpleGrid>
        <Section title={`Machines: ${formatMoney(statement.totals.costs)} of costs`}>
          <MachinesTable machines={statement.machines} households={names} onDrill={setDrill} />
        </Section>
        <Section title={`Use of machines a household does not own: ${formatMoney(statement.totals.useCharges)}`}>
          <UseChargesTable charges={statement.useCharges} households={names} onDrill={setDrill} />
        </Section>
        <Accordion variant="contained">
          <Accordion.Item value="rules">
            <Accordion.Control>How these figures are worked out</Accordion.Control>
            <Accordion.Panel>
              <List size="sm" spacing={4}>
                {statement.rules.map((rule) => (
                  <List.Item key={rule}>{rule}</List.Item>
                ))}
              </List>
            </Accordion.Panel>
          </Accordion.Item>
        </Accordion>
      </Stack>
      <LinesDrawer squareUpId={squareUp.id} drill={drill} onClose={() => setDrill(null)} />
      {canManage && !closed && (
        <ClosePeriodModal squareUpId={squareUp.id} name={squareUp.name} pendingEntries={statement.pendingEntries} opened={closing} onClose={() => setClosing(false)} />
      )}
    </>
  );
}

export function Component() {
  const { squareUpId = '' } = useParams();
  const user = useSessionUserOrThrow();
  const canManage = accessTo(user.role, 'squareUps') === 'manage';
  const statement = useStatement(squareUpId);
  return (
    <>
      <Anchor component={Link} to={paths.squareUps()} size="sm" mb="xs" display="inline-block">
        ← All square-up periods
      </Anchor>
      {statement.isError ? (
        <QueryError error={statement.error} onRetry={() => void statement.refetch()} />
      ) : statement.isPending ? (
        <Skeleton h={400} />
      ) : (
        <Statement statement={statement.data} canManage={canManage} canReviewWork={accessTo(user.role, 'work') === 'manage'} />
      )}
    </>
  );
}
