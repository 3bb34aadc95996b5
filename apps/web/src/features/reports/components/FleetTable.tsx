import { Anchor, Table, Text } from '@mantine/core';
import type { MachineRateRowDto } from '@hitchbook/shared/schemas/reports';
import { formatDecimal, formatRate } from '../../../lib/money';
import { FlagBadges } from './FlagBadges';

const rate = (value: string | null | undefined, unit = 'h') => (value === null || value === undefined ? '—' : formatRate(value, unit));

function CustomRate({ row }: { row: MachineRateRowDto }) {
  const { customRate } = row;
  if (!customRate.source) return <>—</>;
  return (
    <>
      {customRate.perAcre && <Text inherit>{formatRate(customRate.perAcre, 'acre')}</Text>}
      {customRate.perHour && <Text inherit>{formatRate(customRate.perHour, 'h')}</Text>}
      <Text size="xs" c="dimmed">
        {customRate.source === 'invoices' ? 'from invoices' : 'neighbour sheet'}
      </Text>
    </>
  );
}

/** The fleet side by side for the year; a machine's name opens its detail. */
export function FleetTable({ rows, onOpen }: { rows: MachineRateRowDto[]; onOpen: (row: MachineRateRowDto) => void }) {
  return (
    <Table.ScrollContainer minWidth={1000}>
      <Table verticalSpacing="xs" fz="sm" striped highlightOnHover style={{ whiteSpace: 'nowrap' }} data-testid="fleet-table">
        <Table.Thead>
          <Table.Tr>
            <Table.Th>Machine</Table.Th>
            <Table.Th ta="right">Hours</Table.Th>
            <Table.Th ta="right">Acres</Table.Th>
            <Table.Th ta="right">Actual</Table.Th>
            <Table.Th ta="right">Estimate</Table.Th>
            <Table.Th ta="right">Rate now</Table.Th>
            <Table.Th ta="right">Suggested</Table.Th>
            <Table.Th ta="right">Custom rate</Table.Th>
            <Table.Th ta="right">Break-even acres</Table.Th>
            <Table.Th miw={150}>Flags</Table.Th>
          </Table.Tr>
        </Table.Thead>
        <Table.Tbody>
          {rows.map((row) => (
            <Table.Tr key={row.machineId} data-testid="fleet-row">
              <Table.Td>
                <Anchor component="button" type="button" fw={700} onClick={() => onOpen(row)} ta="left">
                  {row.name}
                </Anchor>
                <Text size="xs" c="dimmed">
                  {row.classLabel}
                  {row.status !== 'active' && `, ${row.status}`}
                </Text>
              </Table.Td>
              <Table.Td ta="right">{formatDecimal(row.hours, 1)}</Table.Td>
              <Table.Td ta="right">{formatDecimal(row.acres, 1)}</Table.Td>
              <Table.Td ta="right">{rate(row.perHour?.total)}</Table.Td>
              <Table.Td ta="right">{row.estimate.available ? rate(row.estimate.perHour.total) : '—'}</Table.Td>
              <Table.Td ta="right">{rate(row.currentRate?.perHour)}</Table.Td>
              <Table.Td ta="right" fw={700} c="harbor.9">
                {rate(row.suggestedRate?.perHour)}
              </Table.Td>
              <Table.Td ta="right">
                <CustomRate row={row} />
              </Table.Td>
              <Table.Td ta="right">{row.breakEven.acres === null ? '—' : formatDecimal(row.breakEven.acres, 0)}</Table.Td>
              <Table.Td>
                <FlagBadges flags={row.flags} />
              </Table.Td>
            </Table.Tr>
          ))}
        </Table.Tbody>
      </Table>
    </Table.ScrollContainer>
  );
}
