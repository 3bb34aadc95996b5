import { Badge } from '@mantine/core';
import type { SquareUpStatus } from '@hitchbook/shared/schemas/square-ups';
import { STATUS_COLORS, STATUS_LABELS } from '../labels';

export function StatusBadge({ status }: { status: SquareUpStatus }) {
  return (
    <Badge component="span" color={STATUS_COLORS[status]} variant="light" size="lg" data-testid="period-status">
      {STATUS_LABELS[status]}
    </Badge>
  );
}
