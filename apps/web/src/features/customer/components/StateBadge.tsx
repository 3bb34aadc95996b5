import { Badge } from '@mantine/core';
import type { InvoiceKind, InvoiceState } from '@hitchbook/shared/schemas/invoices';
import { STATE_BADGES, STATE_LABELS } from '../labels';

interface StateBadgeProps {
  state: InvoiceState;
  kind: InvoiceKind;
  size?: 'md' | 'lg';
}

/** A credit note is never "open" to its reader: it is money off an invoice, not a bill to pay. */
export function StateBadge({ state, kind, size = 'lg' }: StateBadgeProps) {
  const creditNote = kind === 'credit-note' && state !== 'void';
  const { color, variant } = creditNote ? { color: 'clay', variant: 'outline' as const } : STATE_BADGES[state];
  return (
    <Badge color={color} variant={variant} size={size} data-testid="invoice-state">
      {creditNote ? 'Credit note' : STATE_LABELS[state]}
    </Badge>
  );
}
