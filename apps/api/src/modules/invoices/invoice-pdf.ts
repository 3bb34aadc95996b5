import PDFDocument from 'pdfkit';
import { Dec } from '@hitchbook/shared/decimal';
import { formatMoney } from '@hitchbook/shared/money';
import type { InvoiceDto, InvoiceLineDto } from '@hitchbook/shared/schemas/invoices';
import { LATO_BOLD, LATO_REGULAR, printOnlyDrawable } from '../../common/pdf/lato.js';


const MARGIN = 50;
const COLUMNS: Array<{ key: keyof Row; title: string; width: number; align: 'left' | 'right' }> = [
  { key: 'date', title: 'Date', width: 62, align: 'left' },
  { key: 'field', title: 'Field', width: 98, align: 'left' },
  { key: 'work', title: 'Work', width: 132, align: 'left' },
  { key: 'quantity', title: 'Quantity', width: 54, align: 'right' },
  { key: 'unit', title: 'Unit', width: 38, align: 'left' },
  { key: 'rate', title: 'Rate', width: 56, align: 'right' },
  { key: 'amount', title: 'Amount', width: 72, align: 'right' },
];

interface Row {
  date: string;
  field: string;
  work: string;
  quantity: string;
  unit: string;
  rate: string;
  amount: string;
}

/** Rates keep up to four places (a mileage rate of $0.6250), money otherwise shows cents. */
function formatRate(rate: string): string {
  const value = new Dec(rate);
  const places = Math.max(2, value.decimalPlaces());
  const [whole = '0', fraction = ''] = value.abs().toFixed(places).split('.');
  return `${value.isNegative() ? '-' : ''}$${whole.replace(/\B(?=(\d{3})+(?!\d))/g, ',')}.${fraction}`;
}

function rowOf(line: InvoiceLineDto): Row {
  return {
    date: line.workDate ?? '',
    field: line.fieldName ?? '',
    work: line.description,
    quantity: line.quantity === null ? '' : new Dec(line.quantity).toString(),
    unit: line.unit ?? '',
    rate: line.rate === null ? '' : formatRate(line.rate),
    amount: formatMoney(line.amount),
  };
}

function titleOf(invoice: InvoiceDto): string {
  const kind = invoice.kind === 'credit-note' ? 'Credit note' : 'Invoice';
  if (invoice.status === 'draft') return `Draft ${kind.toLowerCase()}`;
  return invoice.status === 'void' ? `${kind} (void)` : kind;
}

/**
 * The printable invoice or credit note: who bills whom, each line with date, field, work, quantity,
 * unit, rate and amount, the totals, the terms and how to pay. Figures come from the stored lines only.
 */
export function renderInvoicePdf(invoice: InvoiceDto): Promise<Buffer> {
  const doc = printOnlyDrawable(new PDFDocument({ size: 'LETTER', margin: MARGIN, info: { Title: `${titleOf(invoice)} ${invoice.numberLabel ?? ''}`.trim(), Author: invoice.issuer.name } }));
  doc.registerFont('Lato', LATO_REGULAR);
  doc.registerFont('Lato-Bold', LATO_BOLD);
  const chunks: Buffer[] = [];
  doc.on('data', (chunk: Buffer) => chunks.push(chunk));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });

  const right = doc.page.width - MARGIN;
  const width = right - MARGIN;

  // Header: the operation on the left, the document on the right.
  const top = doc.y;
  doc.font('Lato-Bold').fontSize(16).text(invoice.issuer.name, MARGIN, top, { width: width / 2 });
  doc.font('Lato').fontSize(9);
  for (const part of [invoice.issuer.address, invoice.issuer.email, invoice.issuer.phone]) if (part) doc.text(part, { width: width / 2 });
  const leftBottom = doc.y;
  doc.font('Lato-Bold').fontSize(16).text(titleOf(invoice), MARGIN + width / 2, top, { width: width / 2, align: 'right' });
  doc.font('Lato').fontSize(9);
  const facts = [
    invoice.numberLabel ? `Number ${invoice.numberLabel}` : 'Not yet numbered',
    invoice.issueDate ? `Issued ${invoice.issueDate}` : null,
    invoice.dueDate && invoice.kind === 'invoice' ? `Due ${invoice.dueDate}` : null,
    invoice.periodFrom && invoice.periodTo ? `Work from ${invoice.periodFrom} to ${invoice.periodTo}` : null,
    invoice.creditOf ? `Credits invoice ${invoice.creditOf.numberLabel}` : null,
  ];
  for (const fact of facts) if (fact) doc.text(fact, { width: width / 2, align: 'right' });
  doc.y = Math.max(leftBottom, doc.y) + 18;

  doc.font('Lato-Bold').fontSize(10).text('Bill to', MARGIN, doc.y, { width });
  doc.font('Lato').fontSize(10).text(invoice.party.name, { width });
  for (const part of [invoice.party.address, invoice.party.email]) if (part) doc.text(part, { width });
  doc.moveDown(1.2);

  drawTable(doc, invoice.lines.map(rowOf));

  // Totals, right-aligned under the amount column.
  const discount = invoice.lines.filter((l) => l.kind === 'discount').reduce((s, l) => s.plus(l.amount), new Dec(0));
  const totals: Array<[string, string, boolean]> = [
    ['Subtotal', formatMoney(invoice.subtotal), false],
    ...(discount.isZero() ? [] : ([['Discount', formatMoney(discount), false]] as Array<[string, string, boolean]>)),
    [invoice.kind === 'credit-note' ? 'Total credited' : 'Total', formatMoney(invoice.total), true],
  ];
  if (invoice.kind === 'invoice' && invoice.status === 'issued') {
    if (!new Dec(invoice.amountPaid).isZero()) totals.push(['Paid', formatMoney(new Dec(invoice.amountPaid).neg()), false]);
    if (!new Dec(invoice.amountCredited).isZero()) totals.push(['Credited', formatMoney(new Dec(invoice.amountCredited).neg()), false]);
    totals.push(['Balance due', formatMoney(invoice.balance), true]);
  }
  doc.moveDown(0.6);
  for (const [label, amount, bold] of totals) {
    ensureRoom(doc, 16);
    const y = doc.y;
    doc.font(bold ? 'Lato-Bold' : 'Lato').fontSize(10);
    doc.text(label, right - 230, y, { width: 140, align: 'right' });
    doc.text(amount, right - 90, y, { width: 90, align: 'right' });
    doc.y = y + 15;
  }

  doc.moveDown(1.5);
  doc.x = MARGIN;
  if (invoice.kind === 'invoice') {
    ensureRoom(doc, 90);
    doc.font('Lato-Bold').fontSize(10).text('Terms', MARGIN, doc.y, { width });
    doc.font('Lato').fontSize(9).text(invoice.termsDays === 0 ? 'Due on receipt.' : `Due within ${invoice.termsDays} days${invoice.dueDate ? `, by ${invoice.dueDate}` : ''}.`, { width });
    doc.moveDown(0.6);
    doc.font('Lato-Bold').fontSize(10).text('How to pay', { width });
    doc.font('Lato').fontSize(9);
    if (invoice.payUrl) doc.text(`By card online: ${invoice.payUrl} (sign in with your Hitchbook account).`, { width });
    doc.text(`By cheque or bank transfer to ${invoice.issuer.name}, quoting ${invoice.numberLabel ?? 'the invoice number'}.`, { width });
  }
  if (invoice.notes) {
    doc.moveDown(0.6);
    doc.font('Lato-Bold').fontSize(10).text(invoice.kind === 'credit-note' ? 'Reason' : 'Notes', { width });
    doc.font('Lato').fontSize(9).text(invoice.notes, { width });
  }
  if (invoice.status === 'void' && invoice.voidReason) {
    doc.moveDown(0.6);
    doc.font('Lato-Bold').fontSize(10).text(`Void: ${invoice.voidReason}`, { width });
  }
  doc.end();
  return done;
}

function ensureRoom(doc: PDFKit.PDFDocument, height: number): boolean {
  if (doc.y + height <= doc.page.height - MARGIN) return false;
  doc.addPage();
  return true;
}

function drawHeaderRow(doc: PDFKit.PDFDocument): void {
  const y = doc.y;
  let x = MARGIN;
  doc.font('Lato-Bold').fontSize(8.5);
  for (const c of COLUMNS) {
    doc.text(c.title, x, y, { width: c.width - 4, align: c.align });
    x += c.width;
  }
  doc.y = y + 13;
  doc.moveTo(MARGIN, doc.y - 2).lineTo(doc.page.width - MARGIN, doc.y - 2).lineWidth(0.5).stroke();
}

function drawTable(doc: PDFKit.PDFDocument, rows: Row[]): void {
  drawHeaderRow(doc);
  doc.font('Lato').fontSize(8.5);
  for (const row of rows) {
    const height = Math.max(...COLUMNS.map((c) => doc.heightOfString(row[c.key] || ' ', { width: c.width - 4 }))) + 4;
    if (ensureRoom(doc, height)) {
      drawHeaderRow(doc);
      doc.font('Lato').fontSize(8.5);
    }
    const y = doc.y;
    let x = MARGIN;
    for (const c of COLUMNS) {
      doc.text(row[c.key], x, y, { width: c.width - 4, align: c.align });
      x += c.width;
    }
    doc.y = y + height;
  }
  doc.moveTo(MARGIN, doc.y).lineTo(doc.page.width - MARGIN, doc.y).lineWidth(0.5).stroke();
}
