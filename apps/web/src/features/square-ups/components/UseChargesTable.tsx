import { Anchor, Table, Text } from '@mantine/core';
import { Link } from 'react-router-dom';
import { formatMoney } from '@hitchbook/shared/money';
import type { StatementUseChargeDto } from '@hitchbook/shared/schemas/square-ups';
import { formatDecimal, formatRate } from '../../../lib/money';
import { paths } from '../../../lib/paths';
import type { DrillDown } from './LinesDrawer';
import { FigureButton } from './FigureButton';

/** A household's hours on machines it did not own, at the machine-hour rate, credited to the owners. */
export function UseChargesTable({ charges, households, onDrill }: { charges: StatementUseChargeDto[]; households: Map<string, string>; onDrill: (drill: DrillDown) => void }) {
  if (charges.length === 0) return <Text c="dimmed">No household used a machine it did not own in this period.</Text>;
  return (
    <Table.ScrollContainer minWidth={720}>
      <Table verticalSpacing="sm" striped data-testid="use-charges-table">
        <Table.Thead>
          <Table.Tr>
            <Table.Th>Machine</Table.Th>
            <Table.Th>Used by</Table.Th>
            <Table.Th ta="right">Hours</Table.Th>
            <Table.Th ta="right">Rate</Table.Th>
            <Table.Th ta="right">Charge</Table.Th>
            <Table.Th>Credited to</Table.Th>
          </Table.Tr>
        </Table.Thead>
        <Table.Tbody>
          {charges.map((c) => {
            const user = households.get(c.householdId) ?? 'Household';
            return (
              <Table.Tr key={`${c.machineId}-${c.householdId}-${c.shareSetFrom}-${c.ratePerHour}`}>
                <Table.Td fw={700}>{c.machineName}</Table.Td>
                <Table.Td>{user}</Table.Td>
                <Table.Td ta="right">{formatDecimal(c.hours, 1)}</Table.Td>
                <Table.Td ta="right" style={{ whiteSpace: 'nowrap' }}>
                  {formatRate(c.ratePerHour, 'h')}
                  {c.rateSheetId ? (
                    <Anchor component={Link} to={paths.rateSheet(c.rateSheetId)} size="xs" display="block">
                      sheet rate
                    </Anchor>
                  ) : (
                    <Text size="xs" c="dimmed">
                      actual cost
                    </Text>
                  )}
                </Table.Td>
                <Table.Td ta="right">
                  <FigureButton
                    label={`Use charge of ${user} for ${c.machineName}: show the entries`}
                    onOpen={() =>
                      onDrill({
                        title: `${user} on ${c.machineName}: ${formatMoney(c.amount)}`,
                        kind: 'work',
                        household: { id: c.householdId, name: user },
                        machine: { id: c.machineId, name: c.machineName },
                      })
                    }
                  >
                    {formatMoney(c.amount)}
                  </FigureButton>
                </Table.Td>
                <Table.Td>{c.credits.map((cr) => `${households.get(cr.householdId) ?? 'Household'} ${formatMoney(cr.amount)}`).join(', ')}</Table.Td>
              </Table.Tr>
            );
          })}
        </Table.Tbody>
      </Table>
    </Table.ScrollContainer>
  );
}
