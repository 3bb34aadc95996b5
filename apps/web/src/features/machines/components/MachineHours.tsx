import { Text } from '@mantine/core';
import type { MachineDto } from '@hitchbook/shared/schemas/machines';
import { TABULAR } from '../tabular';
import { formatDecimal } from '../../../lib/money';

/** The hour meter as last read, from the list row itself; implements usually carry none and show a dash. */
export function MachineHours({ reading }: { reading: MachineDto['lastReading'] }) {
  if (!reading) return <Text c="dimmed">—</Text>;
  return <Text style={TABULAR}>{formatDecimal(reading.hours, 1)} h</Text>;
}
