import type { StreamableFile } from '@nestjs/common';
import { COST_CATEGORIES } from '@hitchbook/shared/actual-rate';
import { formatMoney } from '@hitchbook/shared/money';
import type { CustomIncomeReportDto, MachineRateRowDto, MachineRatesReportDto } from '@hitchbook/shared/schemas/reports';
import { csvDownload, type CsvColumn } from '../../common/csv/csv-writer.js';
import { PdfReport } from './pdf-report.js';

// The bookkeeper's files of the year-end reports: the same figures as the JSON, one row per machine
// (or per customer, work type and field), every text cell neutralised against spreadsheet formulas.

/** A report already in memory, handed to the streamed writer as its single batch. */
export async function* oneBatch<T>(rows: readonly T[]): AsyncGenerator<readonly T[]> {
  yield rows;
}

const categoryLabel = (category: string) => category.charAt(0).toUpperCase() + category.slice(1);

const MACHINE_RATE_COLUMNS: CsvColumn<MachineRateRowDto>[] = [
  { header: 'Machine', value: (r) => r.name },
  { header: 'Class', value: (r) => r.classLabel },
  { header: 'Status', value: (r) => r.status },
  { header: 'Hours', kind: 'number', value: (r) => r.hours },
  { header: 'Acres', kind: 'number', value: (r) => r.acres },
  ...COST_CATEGORIES.map((category): CsvColumn<MachineRateRowDto> => ({ header: `${categoryLabel(category)} cost`, kind: 'number', value: (r) => r.costs[category] })),
  { header: 'Total cost', kind: 'number', value: (r) => r.costs.total },
  { header: 'Actual per hour', kind: 'number', value: (r) => r.perHour?.total },
  { header: 'Actual per acre', kind: 'number', value: (r) => r.perAcre?.total },
  { header: 'Estimate per hour', kind: 'number', value: (r) => (r.estimate.available ? r.estimate.perHour.total : null) },
  { header: 'Estimate ownership per year', kind: 'number', value: (r) => (r.estimate.available ? r.estimate.perYear.ownership : null) },
  { header: 'Estimate note', value: (r) => (r.estimate.available ? null : r.estimate.reason) },
  { header: 'Custom rate per acre', kind: 'number', value: (r) => r.customRate.perAcre },
  { header: 'Custom rate source', value: (r) => r.customRate.source },
  { header: 'Break-even acres', kind: 'number', value: (r) => r.breakEven.acres },
  { header: 'Flags', value: (r) => r.flags.map((f) => f.message).join(' ') || null },
  { header: 'Current rate per hour', kind: 'number', value: (r) => r.currentRate?.perHour },
  { header: 'Suggested rate per hour', kind: 'number', value: (r) => r.suggestedRate?.perHour },
  { header: 'Suggested from', value: (r) => r.suggestedRate?.basis },
];

export function machineRatesCsv(report: MachineRatesReportDto): StreamableFile {
  return csvDownload(`machine-rates-${report.year}.csv`, MACHINE_RATE_COLUMNS, oneBatch(report.machines));
}

interface IncomeRow {
  section: 'Customer' | 'Work type' | 'Field';
  name: string;
  detail: string | null;
  count: number | null;
  quantity: string | null;
  hours: string | null;
  acres: string | null;
  amount: string | null;
  costPerAcre: string | null;
}

const INCOME_COLUMNS: CsvColumn<IncomeRow>[] = [
  { header: 'Section', value: (r) => r.section },
  { header: 'Name', value: (r) => r.name },
  { header: 'Detail', value: (r) => r.detail },
  { header: 'Invoices or lines', kind: 'number', value: (r) => r.count },
  { header: 'Quantity', kind: 'number', value: (r) => r.quantity },
  { header: 'Hours', kind: 'number', value: (r) => r.hours },
  { header: 'Acres', kind: 'number', value: (r) => r.acres },
  { header: 'Amount', kind: 'number', value: (r) => r.amount },
  { header: 'Cost per acre', kind: 'number', value: (r) => r.costPerAcre },
];

export function customIncomeCsv(report: CustomIncomeReportDto): StreamableFile {
  const blank = { count: null, quantity: null, hours: null, acres: null, amount: null, costPerAcre: null };
  const rows: IncomeRow[] = [
    ...report.byCustomer.map((c): IncomeRow => ({ ...blank, section: 'Customer', name: c.name, detail: c.relationship, count: c.invoices, amount: c.amount })),
    ...report.byWorkType.map((w): IncomeRow => ({ ...blank, section: 'Work type', name: w.workType, detail: w.unit, count: w.lines, quantity: w.quantity, amount: w.amount })),
    ...report.fields.map((f): IncomeRow => ({ ...blank, section: 'Field', name: f.name, detail: `${f.kind}, ${f.acres} acres`, hours: f.hours, acres: f.acresWorked, amount: f.machineCost, costPerAcre: f.costPerAcre })),
  ];
  return csvDownload(`custom-income-${report.year}.csv`, INCOME_COLUMNS, oneBatch(rows));
}

const money = (value: string | null | undefined) => (value === null || value === undefined ? '–' : formatMoney(value));

export function machineRatesPdf(report: MachineRatesReportDto, operationName: string): Promise<StreamableFile> {
  const pdf = new PdfReport(`Year-end machine rates ${report.year}`, `${operationName} · interest ${report.interestRatePct} % · margin ${report.marginPct} %`);
  pdf.heading('Fleet').table(
    [
      { header: 'Machine', width: 3 },
      { header: 'Hours', width: 1.2, align: 'right' },
      { header: 'Acres', width: 1.2, align: 'right' },
      { header: 'Costs', width: 1.6, align: 'right' },
      { header: 'Actual /h', width: 1.3, align: 'right' },
      { header: 'Estimate /h', width: 1.3, align: 'right' },
      { header: 'Custom /acre', width: 1.3, align: 'right' },
      { header: 'Break-even acres', width: 1.4, align: 'right' },
      { header: 'Now /h', width: 1.2, align: 'right' },
      { header: 'Suggested /h', width: 1.3, align: 'right' },
    ],
    report.machines.map((m) => [
      m.name,
      m.hours,
      m.acres,
      money(m.costs.total),
      money(m.perHour?.total),
      money(m.estimate.available ? m.estimate.perHour.total : null),
      money(m.customRate.perAcre),
      m.breakEven.acres ?? '–',
      money(m.currentRate?.perHour),
      money(m.suggestedRate?.perHour),
    ]),
  );
  const flagged = report.machines.filter((m) => m.flags.length > 0);
  if (flagged.length > 0) {
    pdf.heading('Flags');
    for (const m of flagged) pdf.paragraph(`${m.name}: ${m.flags.map((f) => f.message).join(' ')}`);
  }
  pdf.heading('How the figures are made');
  for (const rule of report.rules) pdf.paragraph(rule, 8);
  pdf.paragraph('Rates and cost figures are estimates to plan with, not tax or legal advice.', 8);
  return pdf.toFile(`machine-rates-${report.year}.pdf`);
}
