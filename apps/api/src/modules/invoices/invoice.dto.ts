import type { Invoice, Operation, Party, Payment } from '@hitchbook/db';
import type { InvoiceDto, InvoiceEntryDto, InvoiceSummaryDto, PartySnapshotDto, PaymentDto } from '@hitchbook/shared/schemas/invoices';
import type { InvoiceListRow, InvoiceSummaryRow, ShownLine } from './invoices.repository.js';
import { numberLabel } from './invoice-numbers.js';

export function snapshotOf(p: Pick<Party | Operation, 'name' | 'email' | 'phone' | 'address'>): PartySnapshotDto {
  return { name: p.name, email: p.email ?? null, phone: p.phone ?? null, address: p.address ?? null };
}

export function toSummaryDto(row: InvoiceListRow): InvoiceSummaryDto {
  const i = row.invoice;
  return {
    id: i.id,
    kind: i.kind,
    series: i.series,
    number: i.number,
    numberLabel: numberLabel(i.series, i.number),
    partyId: i.partyId,
    partyName: row.partyName,
    status: i.status,
    state: row.state,
    periodFrom: i.periodFrom,
    periodTo: i.periodTo,
    issueDate: i.issueDate,
    dueDate: i.dueDate,
    termsDays: i.termsDays,
    subtotal: i.subtotal,
    total: i.total,
    amountPaid: i.amountPaid,
    amountCredited: row.credited,
    balance: row.balance,
    creditOfInvoiceId: i.creditOfInvoiceId,
    sentAt: i.sentAt?.toISOString() ?? null,
    version: i.version,
    createdAt: i.createdAt.toISOString(),
  };
}

export interface InvoiceParts {
  row: InvoiceSummaryRow;
  lines: ShownLine[];
  /** Null in the office's view, which does not list them. */
  entries: InvoiceEntryDto[] | null;
  creditOf: Invoice | null;
  creditNotes: Invoice[];
  /** Printed details: the frozen snapshots once issued, the live ones for a draft. */
  issuer: PartySnapshotDto;
  party: PartySnapshotDto;
  appUrl: string;
}

/** The web page that shows a signed-in customer the invoice and its Pay button. */
export function payUrlOf(appUrl: string, invoice: Pick<Invoice, 'id' | 'kind' | 'status'>): string | null {
  return invoice.kind === 'invoice' && invoice.status === 'issued' ? `${appUrl}/pay/${invoice.id}` : null;
}

/** The distinct work entries the lines bill, in line order. */
export function billedEntryIds(lines: readonly Pick<ShownLine, 'workEntryId'>[]): string[] {
  return [...new Set(lines.map((l) => l.workEntryId).filter((e): e is string => e !== null))];
}

export function toInvoiceDto(parts: InvoiceParts): InvoiceDto {
  const i = parts.row.invoice;
  return {
    ...toSummaryDto(parts.row),
    notes: i.notes,
    voidedAt: i.voidedAt?.toISOString() ?? null,
    voidReason: i.voidReason,
    issuedAt: i.issuedAt?.toISOString() ?? null,
    issuer: parts.issuer,
    party: parts.party,
    lines: parts.lines.map((l) => ({
      id: l.id,
      position: l.position,
      kind: l.kind,
      workEntryId: l.workEntryId,
      workDate: l.workDate,
      description: l.description,
      fieldName: l.fieldName,
      workTypeName: l.workTypeName,
      quantity: l.quantity,
      unit: l.unit,
      rate: l.rate,
      amount: l.amount,
    })),
    entryCount: billedEntryIds(parts.lines).length,
    ...(parts.entries ? { entries: parts.entries } : {}),
    creditOf: parts.creditOf ? { id: parts.creditOf.id, numberLabel: numberLabel(parts.creditOf.series, parts.creditOf.number) } : null,
    creditNotes: parts.creditNotes
      .filter((cn) => cn.status !== 'draft')
      .map((cn) => ({ id: cn.id, numberLabel: numberLabel(cn.series, cn.number), total: cn.total, status: cn.status as 'issued' | 'void' })),
    payUrl: payUrlOf(parts.appUrl, i),
  };
}

export function toPaymentDto(p: Payment): PaymentDto {
  return {
    id: p.id,
    invoiceId: p.invoiceId,
    method: p.method,
    amount: p.amount,
    receivedOn: p.receivedOn,
    reference: p.reference,
    status: p.status,
    amountRefunded: p.amountRefunded,
    refundDue: p.refundDue,
    createdAt: p.createdAt.toISOString(),
  };
}
