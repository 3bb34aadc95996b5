import { Table, Text } from '@mantine/core';
import { formatMoney } from '@hitchbook/shared/money';
import type { Decimal } from 'decimal.js';
import { COST_BREAKDOWN_KEYS } from '@hitchbook/shared/machine-cost';
import type { MachineCostEstimate } from '../api/estimateMachineCost';
import { BREAKDOWN_LABELS, SUBTOTAL_KEYS } from '../breakdownLabels';
import { perAcre } from '../../../lib/money';

interface CostBreakdownTableProps {
  estimate: MachineCostEstimate;
  acresPerHour: string | null;
}

export function CostBreakdownTable({ estimate, acresPerHour }: CostBreakdownTableProps) {
  const acre = (value: string): Decimal | null => (acresPerHour ? perAcre(value, acresPerHour) : null);
  return (
    <Table.ScrollContainer minWidth={420}>
      <Table verticalSpacing="sm" fz="md" data-testid="cost-breakdown">
        <Table.Thead>
          <Table.Tr>
            <Table.Th>Cost</Table.Th>
            <Table.Th ta="right">Per year</Table.Th>
            <Table.Th ta="right">Per hour</Table.Th>
            {acresPerHour && <Table.Th ta="right">Per acre</Table.Th>}
          </Table.Tr>
        </Table.Thead>
        <Table.Tbody>
          {COST_BREAKDOWN_KEYS.map((key) => {
            const subtotal = SUBTOTAL_KEYS.includes(key);
            const perAcreValue = acre(estimate.perHour[key]);
            return (
              <Table.Tr key={key} bg={key === 'total' ? 'harbor.0' : undefined} data-row={key}>
                <Table.Td>
                  <Text fw={subtotal ? 700 : 400}>{BREAKDOWN_LABELS[key]}</Text>
                </Table.Td>
                <Table.Td ta="right" fw={subtotal ? 700 : 400}>
                  {formatMoney(estimate.perYear[key])}
                </Table.Td>
                <Table.Td ta="right" fw={subtotal ? 700 : 400}>
                  {formatMoney(estimate.perHour[key])}
                </Table.Td>
                {acresPerHour && (
                  <Table.Td ta="right" fw={subtotal ? 700 : 400}>
                    {perAcreValue ? formatMoney(perAcreValue) : '—'}
                  </Table.Td>
                )}
              </Table.Tr>
            );
          })}
        </Table.Tbody>
      </Table>
    </Table.ScrollContainer>
  );
}
