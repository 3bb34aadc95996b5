import { randomUUID } from 'node:crypto';
import {
  costEntries,
  fields,
  invoiceEntries,
  invoiceLines,
  invoices,
  machineRates,
  machineShares,
  machines,
  rateSheetLines,
  rateSheets,
  workEntries,
  workTypes,
  type Database,
  type NewMachine,
} from '@hitchbook/db';
import type { OperationFixture } from '../../test-support/fixtures.js';

type Category = 'fuel' | 'repair' | 'parts' | 'tires' | 'insurance' | 'taxes' | 'housing' | 'interest' | 'improvement';

/**
 * Rows for square-up and report tests, written straight to the tables so the tests build exactly the
 * ledger their hand-worked figures describe. One Ledger per test operation.
 */
export class Ledger {
  private workTypeId: string | null = null;

  constructor(
    private readonly db: Database,
    private readonly fx: OperationFixture,
  ) {}

  get operationId(): string {
    return this.fx.operationId;
  }

  async machine(name: string, values: Partial<Omit<NewMachine, 'operationId' | 'name'>> = {}): Promise<string> {
    const [row] = await this.db
      .insert(machines)
      .values({ operationId: this.operationId, name, classId: 'tractor-2wd', kind: 'power', ...values })
      .returning({ id: machines.id });
    return row!.id;
  }

  /** One share set: the ownership from that day until the next set. */
  async shares(machineId: string, effectiveFrom: string, shares: ReadonlyArray<[partyId: string, pct: string]>): Promise<void> {
    await this.db.insert(machineShares).values(shares.map(([partyId, sharePct]) => ({ operationId: this.operationId, machineId, partyId, sharePct, effectiveFrom })));
  }

  async field(name: string, acres: string, ownerPartyId: string | null = null): Promise<string> {
    const [row] = await this.db.insert(fields).values({ operationId: this.operationId, name, acres, ownerPartyId }).returning({ id: fields.id });
    return row!.id;
  }

  async workType(name = 'Tillage'): Promise<string> {
    const [row] = await this.db
      .insert(workTypes)
      .values({ operationId: this.operationId, key: `${name.toLowerCase().replace(/\W+/g, '-')}-${randomUUID().slice(0, 6)}`, name, defaultUnit: 'acre' })
      .returning({ id: workTypes.id });
    return row!.id;
  }

  async cost(machineId: string, category: Category, incurredOn: string, amount: string, paidByPartyId: string | null, extra: { lifeYears?: number; gallons?: string } = {}): Promise<string> {
    const [row] = await this.db
      .insert(costEntries)
      .values({
        operationId: this.operationId,
        machineId,
        category,
        incurredOn,
        amount,
        paidByPartyId,
        improvementLifeYears: extra.lifeYears ?? null,
        gallons: extra.gallons ?? null,
      })
      .returning({ id: costEntries.id });
    return row!.id;
  }

  async entry(values: {
    date: string;
    fieldId: string;
    billTo: string;
    hours: string;
    acres?: string;
    power?: string | null;
    implement?: string | null;
    state?: 'draft' | 'submitted' | 'approved' | 'invoiced' | 'squared';
    workTypeId?: string;
  }): Promise<string> {
    this.workTypeId ??= await this.workType();
    const [row] = await this.db
      .insert(workEntries)
      .values({
        operationId: this.operationId,
        workDate: values.date,
        operatorUserId: this.fx.members.operator.userId,
        fieldId: values.fieldId,
        powerMachineId: values.power ?? null,
        implementMachineId: values.implement ?? null,
        workTypeId: values.workTypeId ?? this.workTypeId,
        hours: values.hours,
        acres: values.acres ?? null,
        billToPartyId: values.billTo,
        state: values.state ?? 'approved',
      })
      .returning({ id: workEntries.id });
    return row!.id;
  }

  async rateSheet(values: {
    relationship: 'family' | 'neighbour' | 'agency';
    effectiveFrom: string;
    operatorWage?: string;
    machineRates?: ReadonlyArray<[machineId: string, ratePerHour: string]>;
    acreRates?: ReadonlyArray<[workTypeId: string, rate: string]>;
  }): Promise<string> {
    const [sheet] = await this.db
      .insert(rateSheets)
      .values({ operationId: this.operationId, name: `${values.relationship} from ${values.effectiveFrom}`, relationship: values.relationship, effectiveFrom: values.effectiveFrom, operatorWage: values.operatorWage ?? '0' })
      .returning({ id: rateSheets.id });
    const rateSheetId = sheet!.id;
    if (values.machineRates?.length) {
      await this.db.insert(machineRates).values(values.machineRates.map(([machineId, ratePerHour]) => ({ operationId: this.operationId, rateSheetId, machineId, ratePerHour })));
    }
    if (values.acreRates?.length) {
      await this.db.insert(rateSheetLines).values(values.acreRates.map(([workTypeId, rate]) => ({ operationId: this.operationId, rateSheetId, workTypeId, unit: 'acre' as const, rate })));
    }
    return rateSheetId;
  }

  /** An issued invoice (or one voided afterwards, or a credit note of another) billing the given entries, one line each. */
  async invoice(values: {
    partyId: string;
    number: number;
    issueDate: string;
    status?: 'issued' | 'void';
    creditOf?: string;
    lines: ReadonlyArray<{ entryId?: string; workDate?: string; workTypeName?: string; kind?: 'work' | 'travel' | 'minimum' | 'adjustment'; quantity?: string; unit?: string; amount: string }>;
  }): Promise<string> {
    const [invoice] = await this.db
      .insert(invoices)
      .values({
        operationId: this.operationId,
        kind: values.creditOf ? 'credit-note' : 'invoice',
        series: values.creditOf ? 'CN' : 'INV',
        creditOfInvoiceId: values.creditOf ?? null,
        partyId: values.partyId,
        number: values.number,
        status: values.status ?? 'issued',
        issueDate: values.issueDate,
        dueDate: values.issueDate,
      })
      .returning({ id: invoices.id });
    const invoiceId = invoice!.id;
    await this.db.insert(invoiceLines).values(
      values.lines.map((line, index) => ({
        operationId: this.operationId,
        invoiceId,
        position: index + 1,
        kind: line.kind ?? 'work',
        workEntryId: line.entryId ?? null,
        workDate: line.workDate ?? null,
        description: line.workTypeName ?? line.kind ?? 'work',
        workTypeName: line.workTypeName ?? null,
        quantity: line.quantity ?? null,
        unit: line.unit ?? null,
        amount: line.amount,
      })),
    );
    const entryIds = values.lines.map((line) => line.entryId).filter((id): id is string => id !== undefined);
    if (entryIds.length > 0 && (values.status ?? 'issued') === 'issued' && !values.creditOf) {
      await this.db.insert(invoiceEntries).values(entryIds.map((workEntryId) => ({ operationId: this.operationId, workEntryId, invoiceId })));
    }
    return invoiceId;
  }
}
