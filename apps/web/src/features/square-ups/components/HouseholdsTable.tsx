import { Table, Text } from '@mantine/core';
import { formatMoney } from '@hitchbook/shared/money';
import type { StatementHouseholdDto } from '@hitchbook/shared/schemas/square-ups';
import { FIGURE_LABELS, HOUSEHOLD_FIGURES, householdTotals, linesKindFor, type HouseholdFigure } from '../statement';
import type { DrillDown } from './LinesDrawer';
import { FigureButton } from './FigureButton';

function balanceColor(balance: string): string | undefined {
  if (balance.startsWith('-')) return 'clay.8';
  return /[1-9]/.test(balance) ? 'harbor.8' : undefined;
}

/** Per household: what it paid, its share, its use charges and credits, and where that leaves it. */
export function HouseholdsTable({ households, onDrill }: { households: StatementHouseholdDto[]; onDrill: (drill: DrillDown) => void }) {
  const totals = householdTotals(households);
  const open = (h: StatementHouseholdDto, figure: HouseholdFigure) =>
    onDrill({
      title: `${h.name}: ${FIGURE_LABELS[figure].toLowerCase()} ${formatMoney(h[figure])}`,
      kind: linesKindFor(figure),
      household: { id: h.householdId, name: h.name },
    });
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
                  <FigureButton strong={f === 'balance'} label={`${FIGURE_LABELS[f]} of ${h.name}: show the entries`} onOpen={() => open(h, f)}>
                    {formatMoney(h[f])}
                  </FigureButton>
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
        Balance = paid − share + use credited − use charged. A positive balance is owed to the household; a negative one
        it owes. Click any figure to see the entries behind it.
      </Text>
    </Table.ScrollContainer>
  );
}
