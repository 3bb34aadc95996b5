import { Text } from '@mantine/core';
import { TABULAR } from '../tabular';
import { formatDecimal } from '../../../lib/money';
import { useLastMeterReading } from '../api/lastMeterReading';

/** The hour meter as last read; implements usually carry none and show a dash. */
export function MachineHours({ machineId }: { machineId: string }) {
  const reading = useLastMeterReading(machineId);
  if (reading.isPending) return <Text c="dimmed">…</Text>;
  if (!reading.data) return <Text c="dimmed">—</Text>;
  return <Text style={TABULAR}>{formatDecimal(reading.data.hours, 1)} h</Text>;
}
