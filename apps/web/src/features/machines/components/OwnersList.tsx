import { Stack, Text } from '@mantine/core';
import type { MachineOwnerDto } from '@hitchbook/shared/schemas/machines';
import { formatSharePct } from '../shares';

export function OwnersList({ owners }: { owners: readonly MachineOwnerDto[] }) {
  if (owners.length === 0) return <Text c="dimmed">No owners set</Text>;
  return (
    <Stack gap={0}>
      {owners.map((o) => (
        <Text key={o.partyId} size="sm">
          {o.name}{' '}
          <Text span c="dimmed" size="sm" style={{ whiteSpace: 'nowrap' }}>
            {formatSharePct(o.sharePct)}
          </Text>
        </Text>
      ))}
    </Stack>
  );
}
