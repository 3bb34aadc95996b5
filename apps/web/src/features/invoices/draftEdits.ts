import type { InvoiceDto } from '@hitchbook/shared/schemas/invoices';

/** A line the owner added by hand, as the draft update takes it. */
export interface ExtraLineInput {
  description: string;
  quantity: string;
  unit: string;
  rate: string;
}

export interface DiscountNow {
  description: string;
  /** Negative, as the invoice prints it. */
  amount: string;
}

/** The owner's added lines on a draft, in order, in the shape the update sends them back. */
export function addedLines(invoice: Pick<InvoiceDto, 'lines'>): Array<ExtraLineInput & { id: string }> {
  return invoice.lines
    .filter((l) => l.kind === 'adjustment')
    .map((l) => ({ id: l.id, description: l.description, quantity: l.quantity ?? '1', unit: l.unit ?? '', rate: l.rate ?? l.amount }));
}

const withoutId = ({ description, quantity, unit, rate }: ExtraLineInput): ExtraLineInput => ({ description, quantity, unit, rate });

// The update replaces the whole list of added lines, so every change sends the ones to keep as well.

export function extraLinesWith(invoice: Pick<InvoiceDto, 'lines'>, line: ExtraLineInput): ExtraLineInput[] {
  return [...addedLines(invoice).map(withoutId), withoutId(line)];
}

export function extraLinesWithout(invoice: Pick<InvoiceDto, 'lines'>, lineId: string): ExtraLineInput[] {
  return addedLines(invoice)
    .filter((l) => l.id !== lineId)
    .map(withoutId);
}

export function currentDiscount(invoice: Pick<InvoiceDto, 'lines'>): DiscountNow | null {
  const line = invoice.lines.find((l) => l.kind === 'discount');
  return line ? { description: line.description, amount: line.amount } : null;
}
