import { Paper, SimpleGrid, Stack, Table, Text } from '@mantine/core';
import { useMediaQuery } from '@mantine/hooks';
import { formatMoney } from '@hitchbook/shared/money';
import type { StatementHouseholdDto } from '@hitchbook/shared/schemas/square-ups';
import { FIGURE_LABELS, HOUSEHOLD_FIGURES, householdTotals, linesKindFor, type HouseholdFigure } from '../statement';
import type { DrillDown } from './LinesDrawer';
import { FigureButton } from './FigureButton';

function balanceColor(balance: string): string | undefined {
  if (balance.startsWith('-')) return 'clay.8';
  return /[1-9]/.test(balance) ? 'harbor.8' : undefined;
}

const NOTE =
  'Balance = paid − share + use credited − use charged. A positive balance is owed to the household; a negative one it owes. Tap any figure to see the entries behind it.';

interface Props {
  households: StatementHouseholdDto[];
  onDrill: (drill: DrillDown) => void;
}

function drillFor(h: StatementHouseholdDto, figure: HouseholdFigure): DrillDown {
  return {
    title: `${h.name}: ${FIGURE_LABELS[figure].toLowerCase()} ${formatMoney(h[figure])}`,
    kind: linesKindFor(figure),
    household: { id: h.householdId, name: h.name },
  };
}

function Figure({ h, figure, onDrill }: { h: StatementHouseholdDto; figure: HouseholdFigure; onDrill: Props['onDrill'] }) {
  return (
    <FigureButton strong={figure === 'balance'} label={`${FIGURE_LABELS[figure]} of ${h.name}: show the entries`} onOpen={() => onDrill(drillFor(h, figure))}>
      {formatMoney(h[figure])}
    </FigureButton>
  );
}

/** On a phone each household is a card with its balance first, so no figure hides off to the side. */
function HouseholdCards({ households, onDrill }: Props) {
  const totals = householdTotals(households);
  return (
    <Stack gap="sm" data-testid="households-table">
      {households.map((h) => (
        <Paper key={h.householdId} withBorder p="sm" radius="md" data-testid="household-row">
          <Text fw={700}>{h.name}</Text>
          <Text fz="xl" data-figure="balance" c={balanceColor(h.balance)}>
            <Figure h={h} figure="balance" onDrill={onDrill} />
          </Text>
          <SimpleGrid cols={2} spacing={4} verticalSpacing={4} mt={4}>
            {HOUSEHOLD_FIGURES.filter((f) => f !== 'balance').map((f) => (
              <Text key={f} size="sm" data-figure={f}>
                <Text span size="sm" c="dimmed">
                  {FIGURE_LABELS[f]}{' '}
                </Text>
                <Figure h={h} figure={f} onDrill={onDrill} />
              </Text>
            ))}
          </SimpleGrid>
        </Paper>
      ))}
      <Text size="sm">
        Balances total <b data-total="balance">{formatMoney(totals.balance)}</b>
      </Text>
      <Text size="sm" c="dimmed">
        {NOTE}
      </Text>
    </Stack>
  );
}

/** Per household: what it paid, its share, its use charges and credits, and where that leaves it. */
export function HouseholdsTable({ households, onDrill }: Props) {
  // Read on the first render, so a phone never draws the wide table first.
  const phone = useMediaQuery('(max-width: 48em)', undefined, { getInitialValueInEffect: false });
  const totals = householdTotals(households);
  if (phone) return <HouseholdCards households={households} onDrill={onDrill} />;
  return (
    <Table.ScrollContainer minWidth={720}>
      <Table verticalSpacing="sm" data-testid="households-table">
        <Table.Thead>
          <Table.Tr>
            <Table.Th>Household</Table.Th>
            {HOUSEHOLD_FIGURES.map((f) => (
              <Table.Th key={f} ta="right">
                {FIGURE_LABELS[f]}
              </Table.Th>
            ))}
          </Table.Tr>
        </Table.Thead>
        <Table.Tbody>
          {households.map((h) => (
            <Table.Tr key={h.householdId} data-testid="household-row">
              <Table.Td fw={700}>{h.name}</Table.Td>
              {HOUSEHOLD_FIGURES.map((f) => (
                <Table.Td key={f} ta="right" data-figure={f} c={f === 'balance' ? balanceColor(h.balance) : undefined}>
                  <Figure h={h} figure={f} onDrill={onDrill} />
                </Table.Td>
              ))}
            </Table.Tr>
          ))}
        </Table.Tbody>
        <Table.Tfoot>
          <Table.Tr>
            <Table.Th>Total</Table.Th>
            {HOUSEHOLD_FIGURES.map((f) => (
              <Table.Th key={f} ta="right" data-total={f}>
                {formatMoney(totals[f])}
              </Table.Th>
            ))}
          </Table.Tr>
        </Table.Tfoot>
      </Table>
      <Text size="sm" c="dimmed" mt="xs">
        {NOTE}
      </Text>
    </Table.ScrollContainer>
  );
}
