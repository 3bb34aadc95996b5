import type { StreamableFile } from '@nestjs/common';
import { formatMoney } from '@hitchbook/shared/money';
import type { SquareUpStatementDto, StatementPoolDto } from '@hitchbook/shared/schemas/square-ups';
import { csvDownload, type CsvColumn } from '../../common/csv/csv-writer.js';
import { PdfReport } from '../reports/pdf-report.js';
import { oneBatch } from '../reports/report-exports.js';

// The statement as the bookkeeper's CSV (one figure per row, so it pivots) and as a printable PDF.

interface StatementRow {
  section: 'Period' | 'Household' | 'Machine costs' | 'Use charge' | 'Transfer' | 'Warning';
  household?: string;
  other?: string;
  machine?: string;
  item?: string;
  basis?: string;
  hours?: string;
  rate?: string;
  amount?: string;
  paidOn?: string | null;
  method?: string | null;
  reference?: string | null;
}

const COLUMNS: CsvColumn<StatementRow>[] = [
  { header: 'Section', value: (r) => r.section },
  { header: 'Household', value: (r) => r.household },
  { header: 'Other household', value: (r) => r.other },
  { header: 'Machine', value: (r) => r.machine },
  { header: 'Item', value: (r) => r.item },
  { header: 'Basis', value: (r) => r.basis },
  { header: 'Hours', kind: 'number', value: (r) => r.hours },
  { header: 'Rate per hour', kind: 'number', value: (r) => r.rate },
  { header: 'Amount', kind: 'number', value: (r) => r.amount },
  { header: 'Paid on', value: (r) => r.paidOn },
  { header: 'Method', value: (r) => r.method },
  { header: 'Reference', value: (r) => r.reference },
];

function poolItem(pool: StatementPoolDto): string {
  return pool.costKinds.length === 2 ? 'Fixed and operating costs' : pool.costKinds[0] === 'fixed' ? 'Fixed costs' : 'Operating costs';
}

function poolBasis(pool: StatementPoolDto): string {
  if (pool.basis === 'use') return 'by owners’ use';
  return `by shares from ${pool.shareSetFrom}${pool.reason === 'no-owner-use' ? ' (no owner use)' : ''}`;
}

function rows(statement: SquareUpStatementDto): StatementRow[] {
  const name = new Map(statement.households.map((h) => [h.householdId, h.name]));
  const { squareUp } = statement;
  const out: StatementRow[] = [
    { section: 'Period', item: `${squareUp.name} (${squareUp.periodFrom} to ${squareUp.periodTo})`, basis: `${squareUp.status}; fixed costs by ${squareUp.fixedCostsBy}` },
  ];
  for (const h of statement.households) {
    for (const [item, amount] of [['Paid', h.paid], ['Share', h.share], ['Use charged', h.useCharged], ['Use credited', h.useCredited], ['Balance', h.balance]] as const) {
      out.push({ section: 'Household', household: h.name, item, amount });
    }
  }
  for (const machine of statement.machines) {
    for (const pool of machine.pools) {
      for (const paid of pool.paid) out.push({ section: 'Machine costs', household: name.get(paid.householdId), machine: machine.name, item: `Paid: ${poolItem(pool).toLowerCase()}`, basis: poolBasis(pool), amount: paid.amount });
      for (const part of pool.split) out.push({ section: 'Machine costs', household: name.get(part.householdId), machine: machine.name, item: `Share: ${poolItem(pool).toLowerCase()}`, basis: poolBasis(pool), amount: part.amount });
    }
  }
  for (const charge of statement.useCharges) {
    for (const credit of charge.credits) {
      out.push({
        section: 'Use charge',
        household: name.get(charge.householdId),
        other: name.get(credit.householdId),
        machine: charge.machineName,
        item: 'Use of a machine not owned',
        basis: charge.rateSource === 'rate-sheet' ? 'family rate sheet' : 'actual cost per hour',
        hours: charge.hours,
        rate: charge.ratePerHour,
        amount: credit.amount,
      });
    }
  }
  for (const t of statement.transfers) {
    out.push({ section: 'Transfer', household: t.fromName, other: t.toName, item: `Transfer ${t.position}`, amount: t.amount, paidOn: t.paidOn, method: t.method, reference: t.reference });
  }
  for (const w of statement.warnings) out.push({ section: 'Warning', item: w.message });
  return out;
}

function fileName(statement: SquareUpStatementDto, extension: string): string {
  return `square-up-${statement.squareUp.periodFrom}-to-${statement.squareUp.periodTo}.${extension}`;
}

export function statementCsv(statement: SquareUpStatementDto): StreamableFile {
  return csvDownload(fileName(statement, 'csv'), COLUMNS, oneBatch(rows(statement)));
}

export function statementPdf(statement: SquareUpStatementDto, operationName: string): Promise<StreamableFile> {
  const { squareUp } = statement;
  const state = squareUp.status === 'closed' ? `closed ${squareUp.closedAt?.slice(0, 10) ?? ''}` : 'open: figures change as entries are approved';
  const pdf = new PdfReport(`Square-up: ${squareUp.name}`, `${operationName} · ${squareUp.periodFrom} to ${squareUp.periodTo} · ${state}`);
  const name = new Map(statement.households.map((h) => [h.householdId, h.name]));

  pdf.heading('Households').table(
    [
      { header: 'Household', width: 3 },
      { header: 'Paid', width: 1.4, align: 'right' },
      { header: 'Share', width: 1.4, align: 'right' },
      { header: 'Use charged', width: 1.4, align: 'right' },
      { header: 'Use credited', width: 1.4, align: 'right' },
      { header: 'Balance', width: 1.4, align: 'right' },
    ],
    statement.households.map((h) => [h.name, formatMoney(h.paid), formatMoney(h.share), formatMoney(h.useCharged), formatMoney(h.useCredited), formatMoney(h.balance)]),
  );
  pdf.heading('Transfers that square everyone').table(
    [
      { header: 'From', width: 3 },
      { header: 'To', width: 3 },
      { header: 'Amount', width: 1.5, align: 'right' },
      { header: 'Paid', width: 2.5 },
    ],
    statement.transfers.map((t) => [t.fromName, t.toName, formatMoney(t.amount), t.paidOn ? `${t.paidOn} ${t.method ?? ''} ${t.reference ?? ''}`.trim() : '–']),
  );
  pdf.heading('Machines').table(
    [
      { header: 'Machine', width: 3 },
      { header: 'Fixed costs', width: 1.5, align: 'right' },
      { header: 'Operating costs', width: 1.5, align: 'right' },
      { header: 'Owners’ hours', width: 3 },
      { header: 'Others’ hours', width: 1.3, align: 'right' },
    ],
    statement.machines.map((m) => [
      m.name,
      formatMoney(m.fixedCosts),
      formatMoney(m.operatingCosts),
      m.ownerHours.map((o) => `${name.get(o.householdId) ?? ''} ${o.hours}`).join(', ') || '–',
      m.otherHours,
    ]),
  );
  if (statement.useCharges.length > 0) {
    pdf.heading('Use of machines not owned').table(
      [
        { header: 'Machine', width: 3 },
        { header: 'Used by', width: 2.5 },
        { header: 'Hours', width: 1, align: 'right' },
        { header: 'Rate', width: 1.2, align: 'right' },
        { header: 'Charge', width: 1.4, align: 'right' },
      ],
      statement.useCharges.map((u) => [u.machineName, name.get(u.householdId) ?? '', u.hours, formatMoney(u.ratePerHour), formatMoney(u.amount)]),
    );
  }
  if (statement.warnings.length > 0) {
    pdf.heading('Left out or to check');
    for (const w of statement.warnings) pdf.paragraph(w.message);
  }
  pdf.heading('How the figures are made');
  for (const rule of statement.rules) pdf.paragraph(rule, 8);
  return pdf.toFile(fileName(statement, 'pdf'));
}
