import { Badge, Drawer, Group, Pagination, Skeleton, Stack, Table, Tabs, Text } from '@mantine/core';
import { useMediaQuery } from '@mantine/hooks';
import { useState } from 'react';
import { formatMoney } from '@hitchbook/shared/money';
import type { StatementCostLineDto, StatementLineKind, StatementWorkLineDto } from '@hitchbook/shared/schemas/square-ups';
import { EmptyState } from '../../../components/EmptyState';
import { QueryError } from '../../../components/QueryError';
import { COST_CATEGORY_LABELS } from '../../machines/labels';
import { formatDecimal } from '../../../lib/money';
import { LINES_PAGE_SIZE, useStatementLines } from '../api/getStatementLines';
import { COST_KIND_LABELS } from '../labels';
import { costLineRoles, LINE_ROLE_LABELS, workLineRole, type LineRole } from '../statement';

/** What a drill-down explains: a household's figures, a machine's costs and hours, or both. */
export interface DrillDown {
  title: string;
  kind: StatementLineKind;
  household?: { id: string; name: string };
  machine?: { id: string; name: string };
}

const ROLE_COLORS: Record<LineRole, string> = { paid: 'harbor', share: 'slate', charged: 'clay', credited: 'harbor', 'own-use': 'slate' };

function Roles({ roles }: { roles: LineRole[] }) {
  return (
    <Group gap={4} wrap="nowrap">
      {roles.map((role) => (
        <Badge key={role} color={ROLE_COLORS[role]} variant="light">
          {LINE_ROLE_LABELS[role]}
        </Badge>
      ))}
    </Group>
  );
}

function CostLines({ lines, withRoles }: { lines: StatementCostLineDto[]; withRoles: boolean }) {
  return (
    <Table.ScrollContainer minWidth={760}>
      <Table verticalSpacing={6} striped data-testid="cost-lines">
        <Table.Thead>
          <Table.Tr>
            <Table.Th>Date</Table.Th>
            <Table.Th>Machine</Table.Th>
            <Table.Th>Category</Table.Th>
            <Table.Th>Paid by</Table.Th>
            <Table.Th>Vendor</Table.Th>
            {withRoles && <Table.Th>Counts in</Table.Th>}
            <Table.Th ta="right">Amount</Table.Th>
          </Table.Tr>
        </Table.Thead>
        <Table.Tbody>
          {lines.map((line) => (
            <Table.Tr key={`${line.costEntryId}-${line.improvementSlice?.index ?? 0}`}>
              <Table.Td style={{ whiteSpace: 'nowrap' }}>{line.incurredOn}</Table.Td>
              <Table.Td>{line.machineName}</Table.Td>
              <Table.Td>
                {COST_CATEGORY_LABELS[line.category as keyof typeof COST_CATEGORY_LABELS] ?? line.category}
                {line.improvementSlice && ` (year ${line.improvementSlice.index} of ${line.improvementSlice.of})`}
                <Text span size="xs" c="dimmed">
                  {' '}
                  {COST_KIND_LABELS[line.costKind]}
                </Text>
              </Table.Td>
              <Table.Td>{line.paidByName ?? '—'}</Table.Td>
              <Table.Td>{line.vendor ?? '—'}</Table.Td>
              {withRoles && (
                <Table.Td>
                  <Roles roles={costLineRoles(line)} />
                </Table.Td>
              )}
              <Table.Td ta="right">{formatMoney(line.amount)}</Table.Td>
            </Table.Tr>
          ))}
        </Table.Tbody>
      </Table>
    </Table.ScrollContainer>
  );
}

function WorkLines({ lines, householdId }: { lines: StatementWorkLineDto[]; householdId: string | undefined }) {
  return (
    <Table.ScrollContainer minWidth={760}>
      <Table verticalSpacing={6} striped data-testid="work-lines">
        <Table.Thead>
          <Table.Tr>
            <Table.Th>Date</Table.Th>
            <Table.Th>Machine</Table.Th>
            <Table.Th>Field and work</Table.Th>
            <Table.Th>Use of</Table.Th>
            {householdId && <Table.Th>Counts in</Table.Th>}
            <Table.Th ta="right">Hours</Table.Th>
            <Table.Th ta="right">Acres</Table.Th>
          </Table.Tr>
        </Table.Thead>
        <Table.Tbody>
          {lines.map((line) => (
            <Table.Tr key={`${line.workEntryId}-${line.machineId}`}>
              <Table.Td style={{ whiteSpace: 'nowrap' }}>{line.workDate}</Table.Td>
              <Table.Td>{line.machineName}</Table.Td>
              <Table.Td>
                {line.fieldName}: {line.workTypeName}
              </Table.Td>
              <Table.Td>
                {line.householdName}
                <Text span size="xs" c="dimmed">
                  {' '}
                  {line.userOwned ? 'owner' : 'not an owner'}
                </Text>
              </Table.Td>
              {householdId && (
                <Table.Td>
                  <Roles roles={[workLineRole(line, householdId)]} />
                </Table.Td>
              )}
              <Table.Td ta="right">{formatDecimal(line.hours, 2)}</Table.Td>
              <Table.Td ta="right">{line.acres === null ? '—' : formatDecimal(line.acres, 1)}</Table.Td>
            </Table.Tr>
          ))}
        </Table.Tbody>
      </Table>
    </Table.ScrollContainer>
  );
}

function LinesPanel({ squareUpId, drill, kind }: { squareUpId: string; drill: DrillDown; kind: StatementLineKind }) {
  const [page, setPage] = useState(1);
  const lines = useStatementLines(squareUpId, { kind, household: drill.household?.id, machine: drill.machine?.id, page }, true);
  if (lines.isError) return <QueryError error={lines.error} onRetry={() => void lines.refetch()} />;
  if (lines.isPending) return <Skeleton h={240} />;
  const data = lines.data;
  if (data.total === 0) return <EmptyState title={kind === 'cost' ? 'No cost entries behind this figure' : 'No work entries behind this figure'} />;
  const pages = Math.ceil(data.total / LINES_PAGE_SIZE);
  return (
    <Stack gap="sm">
      <Text size="sm" c="dimmed">
        {data.total} {kind === 'cost' ? 'cost lines' : 'machine-hour lines'}
        {pages > 1 && `, page ${data.page} of ${pages}`}
      </Text>
      {data.kind === 'cost' ? <CostLines lines={data.items} withRoles={drill.household !== undefined} /> : <WorkLines lines={data.items} householdId={drill.household?.id} />}
      {pages > 1 && <Pagination total={pages} value={page} onChange={setPage} size="md" />}
    </Stack>
  );
}

function DrillTabs({ squareUpId, drill }: { squareUpId: string; drill: DrillDown }) {
  const [kind, setKind] = useState<StatementLineKind>(drill.kind);
  return (
    <Tabs value={kind} onChange={(value) => setKind(value === 'work' ? 'work' : 'cost')} keepMounted={false}>
      <Tabs.List mb="md">
        <Tabs.Tab value="cost">Cost entries</Tabs.Tab>
        <Tabs.Tab value="work">Work entries</Tabs.Tab>
      </Tabs.List>
      <Tabs.Panel value="cost">
        <LinesPanel squareUpId={squareUpId} drill={drill} kind="cost" />
      </Tabs.Panel>
      <Tabs.Panel value="work">
        <LinesPanel squareUpId={squareUpId} drill={drill} kind="work" />
      </Tabs.Panel>
    </Tabs>
  );
}

/** The entries behind a figure, from the statement's lines route, a page at a time. */
export function LinesDrawer({ squareUpId, drill, onClose }: { squareUpId: string; drill: DrillDown | null; onClose: () => void }) {
  const phone = useMediaQuery('(max-width: 48em)');
  return (
    <Drawer opened={drill !== null} onClose={onClose} position="right" size={phone ? '100%' : '70rem'} title={drill?.title} data-testid="lines-drawer">
      {/* Keyed by what is asked, so each drill-down opens on its own tab and first page. */}
      {drill && <DrillTabs key={`${drill.title}|${drill.kind}`} squareUpId={squareUpId} drill={drill} />}
    </Drawer>
  );
}
