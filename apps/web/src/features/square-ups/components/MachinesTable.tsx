import { Table } from '@mantine/core';
import { formatMoney } from '@hitchbook/shared/money';
import type { StatementMachineDto } from '@hitchbook/shared/schemas/square-ups';
import { formatDecimal } from '../../../lib/money';
import type { DrillDown } from './LinesDrawer';
import { FigureButton } from './FigureButton';

/** Each machine's costs in the period and the hours that weigh the use split and the use charges. */
export function MachinesTable({ machines, households, onDrill }: { machines: StatementMachineDto[]; households: Map<string, string>; onDrill: (drill: DrillDown) => void }) {
  const open = (m: StatementMachineDto, what: string, kind: DrillDown['kind']) =>
    onDrill({ title: `${m.name}: ${what}`, kind, machine: { id: m.machineId, name: m.name } });
  return (
    <Table.ScrollContainer minWidth={720}>
      <Table verticalSpacing="sm" striped data-testid="machines-table">
        <Table.Thead>
          <Table.Tr>
            <Table.Th>Machine</Table.Th>
            <Table.Th ta="right">Fixed costs</Table.Th>
            <Table.Th ta="right">Operating costs</Table.Th>
            <Table.Th>Owners’ hours</Table.Th>
            <Table.Th ta="right">Others’ hours</Table.Th>
          </Table.Tr>
        </Table.Thead>
        <Table.Tbody>
          {machines.map((m) => (
            <Table.Tr key={m.machineId}>
              <Table.Td fw={700}>{m.name}</Table.Td>
              <Table.Td ta="right">
                <FigureButton label={`Fixed costs of ${m.name}: show the entries`} onOpen={() => open(m, `fixed costs ${formatMoney(m.fixedCosts)}`, 'cost')}>
                  {formatMoney(m.fixedCosts)}
                </FigureButton>
              </Table.Td>
              <Table.Td ta="right">
                <FigureButton label={`Operating costs of ${m.name}: show the entries`} onOpen={() => open(m, `operating costs ${formatMoney(m.operatingCosts)}`, 'cost')}>
                  {formatMoney(m.operatingCosts)}
                </FigureButton>
              </Table.Td>
              <Table.Td>
                {m.ownerHours.length === 0
                  ? '—'
                  : m.ownerHours.map((o) => `${households.get(o.householdId) ?? 'Household'} ${formatDecimal(o.hours, 1)} h`).join(', ')}
              </Table.Td>
              <Table.Td ta="right">
                <FigureButton label={`Other households' hours on ${m.name}: show the entries`} onOpen={() => open(m, `${formatDecimal(m.otherHours, 1)} h of others’ use`, 'work')}>
                  {formatDecimal(m.otherHours, 1)} h
                </FigureButton>
              </Table.Td>
            </Table.Tr>
          ))}
        </Table.Tbody>
      </Table>
    </Table.ScrollContainer>
  );
}
