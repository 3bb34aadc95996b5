import { Inject, Injectable, type StreamableFile } from '@nestjs/common';
import type { Decimal } from 'decimal.js';
import { Dec, fixed } from '@hitchbook/shared/decimal';
import { allocateOrThrow, roundToCent, toMoneyString } from '@hitchbook/shared/money';
import type { CustomIncomeReportDto } from '@hitchbook/shared/schemas/reports';
import { CustomIncomeRepository, type IncomeByLine } from './custom-income.repository.js';
import { MachineRatesService } from './machine-rates.service.js';
import { yearBounds } from '@hitchbook/db/square-up-sums';
import { customIncomeCsv } from './report-exports.js';

export const CUSTOM_INCOME_RULES = [
  'Income: the lines of issued invoices and credit notes (credit notes count negative) by the invoice’s issue date; void invoices are left out.',
  'By work type: the work type printed on each work line; minimum charges, travel, fuel adjustments, labour and adjustments on rows of their own.',
  'Cost per acre by field: each machine’s actual costs of the year (as in the machine-rates report) spread over the fields by the machine’s hours on each, to the cent, then divided by the field’s acres.',
];

const LINE_KIND_LABELS: Record<string, string> = {
  minimum: 'Minimum charges',
  travel: 'Travel',
  'fuel-adjustment': 'Fuel adjustment',
  labour: 'Operator labour',
  adjustment: 'Adjustments',
  discount: 'Discounts',
};

function workTypeLabel(line: IncomeByLine): string {
  if (line.kind === 'work') return line.workTypeName ?? 'Work';
  return LINE_KIND_LABELS[line.kind] ?? line.kind;
}

@Injectable()
export class CustomIncomeService {
  constructor(
    @Inject(CustomIncomeRepository) private readonly repo: CustomIncomeRepository,
    @Inject(MachineRatesService) private readonly rates: MachineRatesService,
  ) {}

  async report(operationId: string, year: number): Promise<CustomIncomeReportDto> {
    const bounds = yearBounds(year);
    const [customers, lines, fields, machineFields, actual] = await Promise.all([
      this.repo.byCustomer(operationId, bounds),
      this.repo.byLine(operationId, bounds),
      this.repo.fieldWork(operationId, bounds),
      this.repo.machineFieldHours(operationId, bounds),
      this.rates.actualRates(operationId, year),
    ]);

    const fieldCost = new Map<string, Decimal>();
    let unallocated = new Dec(0);
    for (const [machineId, rate] of actual) {
      const cost = roundToCent(rate.perYear.total);
      if (cost.isZero()) continue;
      const onFields = machineFields.filter((row) => row.machineId === machineId && new Dec(row.hours).gt(0));
      if (onFields.length === 0) {
        unallocated = unallocated.plus(cost);
        continue;
      }
      const parts = allocateOrThrow(cost, onFields.map((row) => row.hours));
      onFields.forEach((row, index) => fieldCost.set(row.fieldId, (fieldCost.get(row.fieldId) ?? new Dec(0)).plus(parts[index]!)));
    }

    const total = customers.reduce((sum, row) => sum.plus(row.amount), new Dec(0));
    return {
      year,
      total: toMoneyString(total),
      byCustomer: customers.map((row) => ({ partyId: row.partyId, name: row.name, relationship: row.relationship, amount: toMoneyString(row.amount), invoices: row.invoices })),
      byWorkType: lines.map((line) => ({
        workType: workTypeLabel(line),
        unit: line.unit,
        quantity: line.quantity === null ? null : fixed(new Dec(line.quantity), 3),
        amount: toMoneyString(line.amount),
        lines: line.lines,
      })),
      fields: fields.map((field) => {
        const cost = fieldCost.get(field.fieldId) ?? new Dec(0);
        const acres = new Dec(field.acres);
        return {
          fieldId: field.fieldId,
          name: field.name,
          kind: field.kind,
          acres: fixed(acres, 3),
          hours: fixed(new Dec(field.hours), 2),
          acresWorked: fixed(new Dec(field.acresWorked), 3),
          machineCost: toMoneyString(cost),
          costPerAcre: acres.gt(0) ? toMoneyString(cost.div(acres)) : null,
        };
      }),
      unallocatedMachineCost: toMoneyString(unallocated),
      rules: CUSTOM_INCOME_RULES,
    };
  }

  async reportCsv(operationId: string, year: number): Promise<StreamableFile> {
    return customIncomeCsv(await this.report(operationId, year));
  }
}
