import { Decimal } from 'decimal.js';
import { formatMoney } from '@hitchbook/shared/money';
import type { InvoiceLineDto } from '@hitchbook/shared/schemas/invoices';
import { formatDecimal } from '../../lib/money';
import { formatDay, LINE_KIND_LABELS } from './labels';

/** One invoice line as the tables print it; every figure is the server's, only formatted here. */
export interface LineView {
  id: string;
  date: string | null;
  field: string | null;
  /** The work type for a work line; what the line is (travel, minimum…) for the others. */
  what: string;
  /** The line's own wording when it says more than its kind. */
  detail: string | null;
  quantity: string | null;
  unit: string | null;
  rate: string | null;
  amount: string;
  isWork: boolean;
}

/** Quantities without trailing zeros: 31.700 acres reads as 31.7. */
function formatQuantity(quantity: string): string {
  return formatDecimal(quantity, new Decimal(quantity).decimalPlaces());
}

/** Rates keep up to four places (fuel adjustments and mileage need them) but always show cents. */
export function formatLineRate(rate: string): string {
  return `$${formatDecimal(rate, Math.max(2, new Decimal(rate).decimalPlaces()))}`;
}

export function lineView(line: InvoiceLineDto): LineView {
  const isWork = line.kind === 'work';
  // A line the owner added (or a credit note's line) is best named by its own wording.
  const what = isWork ? (line.workTypeName ?? line.description) : line.kind === 'adjustment' ? line.description : LINE_KIND_LABELS[line.kind];
  return {
    id: line.id,
    date: line.workDate ? formatDay(line.workDate) : null,
    field: line.fieldName,
    what,
    detail: line.description && line.description !== what ? line.description : null,
    quantity: line.quantity === null ? null : formatQuantity(line.quantity),
    unit: line.unit,
    rate: line.rate === null ? null : formatLineRate(line.rate),
    amount: formatMoney(line.amount),
    isWork,
  };
}
