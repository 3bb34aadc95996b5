import type { ReactNode } from 'react';
import { Paper, SimpleGrid, Stack, Text, Title } from '@mantine/core';
import { formatMoney } from '@hitchbook/shared/money';
import type { MachineDto } from '@hitchbook/shared/schemas/machines';
import { formatDecimal } from '../../../lib/money';
import { FUEL_LABELS, KIND_LABELS } from '../labels';

function Fact({ label, children }: { label: string; children: ReactNode }) {
  return (
    <Stack gap={0}>
      <Text size="sm" c="dimmed">
        {label}
      </Text>
      <Text fw={600}>{children ?? '—'}</Text>
    </Stack>
  );
}

const dash = (value: string | number | null | undefined) => (value === null || value === undefined || value === '' ? '—' : value);

/** Prices come only to money roles; for everyone else the server leaves them out. */
export function MachineDetails({ machine, showMoney }: { machine: MachineDto; showMoney: boolean }) {
  return (
    <Paper withBorder p="md" radius="md" data-testid="machine-details">
      <Stack gap="md">
        <Title order={2} size="h4">
          Details
        </Title>
        <SimpleGrid cols={{ base: 2, sm: 3 }} spacing="md" verticalSpacing="sm">
          <Fact label="Class">{machine.classLabel}</Fact>
          <Fact label="Kind">{KIND_LABELS[machine.kind]}</Fact>
          <Fact label="Make and model">{[machine.make, machine.model].filter(Boolean).join(' ') || '—'}</Fact>
          <Fact label="Year">{dash(machine.year)}</Fact>
          <Fact label="Unit number">{dash(machine.unitNumber)}</Fact>
          <Fact label="Serial number">{dash(machine.serialNumber)}</Fact>
          {machine.kind !== 'implement' && <Fact label="PTO horsepower">{machine.ptoHp ? `${formatDecimal(machine.ptoHp, 0)} hp` : '—'}</Fact>}
          {machine.kind !== 'implement' && <Fact label="Fuel">{machine.fuelType ? FUEL_LABELS[machine.fuelType] : '—'}</Fact>}
          <Fact label="Working width">{machine.widthFt ? `${formatDecimal(machine.widthFt, 1)} ft` : '—'}</Fact>
          <Fact label="Purchased">{dash(machine.purchaseDate)}</Fact>
          <Fact label="Hours at purchase">{`${formatDecimal(machine.hoursAtPurchase, 1)} h`}</Fact>
          {showMoney && <Fact label="List price">{machine.listPrice ? formatMoney(machine.listPrice) : '—'}</Fact>}
          {showMoney && <Fact label="Purchase price">{machine.purchasePrice ? formatMoney(machine.purchasePrice) : '—'}</Fact>}
        </SimpleGrid>
        {machine.notes && (
          <Text size="sm" c="dimmed" style={{ whiteSpace: 'pre-wrap' }}>
            {machine.notes}
          </Text>
        )}
      </Stack>
    </Paper>
  );
}
