import { Badge, Group, Tooltip } from '@mantine/core';
import type { MachineRateRowDto } from '@hitchbook/shared/schemas/reports';
import { FLAG_LABELS } from '../yearEnd';

export function FlagBadges({ flags }: { flags: MachineRateRowDto['flags'] }) {
  if (flags.length === 0) return null;
  return (
    <Group gap={4}>
      {flags.map((flag) => (
        <Tooltip key={flag.code} label={flag.message} multiline w={280}>
          <Badge color={flag.code === 'actual-above-estimate' ? 'clay' : 'slate'} variant="light">
            {FLAG_LABELS[flag.code]}
          </Badge>
        </Tooltip>
      ))}
    </Group>
  );
}
