import { Badge } from '@mantine/core';
import type { InvoiceState } from '@hitchbook/shared/schemas/invoices';
import { STATE_BADGES, STATE_LABELS } from '../labels';

export function StateBadge({ state, size = 'lg' }: { state: InvoiceState; size?: 'md' | 'lg' }) {
  const { color, variant } = STATE_BADGES[state];
  return (
    <Badge color={color} variant={variant} size={size} data-testid="invoice-state">
      {STATE_LABELS[state]}
    </Badge>
  );
}
