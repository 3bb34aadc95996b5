import type { Decimal } from 'decimal.js';
import { FUEL_TICKET_IMPORT_COLUMNS, MAX_ENTRY_HOURS, WORK_ENTRY_IMPORT_COLUMNS, type ImportRowError } from '@hitchbook/shared/schemas/work-entries';
import type { CsvDataRow } from '../../common/csv/csv-reader.js';
import { completeDraft, type EntryColumns } from './entry-draft.js';
import { dateCell, NameIndex, numberCell, singleLineCell, type Cell, type NumberRules } from './import-cells.js';
import type { FieldRef, MachineRef, OperatorRef, PartyRef, WorkTypeRef } from './references.repository.js';

export type EntryHeader = (typeof WORK_ENTRY_IMPORT_COLUMNS)[number]['header'];
export type FuelHeader = (typeof FUEL_TICKET_IMPORT_COLUMNS)[number]['header'];

export interface ImportCatalogue {
  fields: NameIndex<FieldRef>;
  machines: NameIndex<MachineRef>;
  workTypes: NameIndex<WorkTypeRef>;
  parties: NameIndex<PartyRef>;
  households: NameIndex<PartyRef>;
  operators: NameIndex<OperatorRef>;
}

export function importCatalogue(rows: { fields: FieldRef[]; machines: MachineRef[]; workTypes: WorkTypeRef[]; parties: PartyRef[]; operators: OperatorRef[] }): ImportCatalogue {
  return {
    fields: new NameIndex(rows.fields, (f) => [f.name], 'field'),
    machines: new NameIndex(rows.machines, (m) => [m.name, m.unitNumber], 'machine'),
    workTypes: new NameIndex(rows.workTypes, (w) => [w.name, w.key], 'work type'),
    parties: new NameIndex(rows.parties, (p) => [p.name], 'household or customer'),
    households: new NameIndex(
      rows.parties.filter((p) => p.kind === 'household'),
      (p) => [p.name],
      'household',
    ),
    operators: new NameIndex(rows.operators, (o) => [o.email], 'owner, partner or operator with the e-mail'),
  };
}

/** One row read into what it would store; `keyParts` is its normalised content for the import key. */
export interface ResolvedRow<Columns, Preview> {
  row: number;
  columns: Columns;
  preview: Preview;
  keyParts: Array<string | null>;
}

export type RowResult<Columns, Preview> = { problems: ImportRowError[]; resolved: ResolvedRow<Columns, Preview> | null };

/** Collects each cell's reading and its problem, so a row reports every bad cell at once. */
class RowReader<H extends string> {
  readonly problems: ImportRowError[] = [];

  constructor(private readonly data: CsvDataRow) {
    this.problems.push(...data.problems);
  }

  text(column: H): string {
    return this.data.cells.get(column) ?? '';
  }

  required<T>(column: H, read: (text: string) => Cell<T>): T | null {
    const text = this.text(column);
    if (text === '') {
      this.problems.push({ row: this.data.row, column, reason: 'Required.' });
      return null;
    }
    return this.cell(column, read(text));
  }

  optional<T>(column: H, read: (text: string) => Cell<T>): T | null {
    const text = this.text(column);
    return text === '' ? null : this.cell(column, read(text));
  }

  problem(column: H | '', reason: string): void {
    this.problems.push({ row: this.data.row, column, reason });
  }

  private cell<T>(column: H, result: Cell<T>): T | null {
    if (result.ok) return result.value;
    this.problems.push({ row: this.data.row, column, reason: result.reason });
    return null;
  }
}

const num = (rules: NumberRules) => (text: string) => numberCell(text, rules);
const HOURS: NumberRules = { min: 0, max: MAX_ENTRY_HOURS, decimals: 2 };
const METER: NumberRules = { min: 0, max: 1_000_000, decimals: 1 };
const decText = (d: Decimal | null) => (d === null ? null : d.toFixed());

/** Where a rule on the whole entry lands in the file's columns. */
const ENTRY_PATHS: Record<string, EntryHeader> = {
  meterStart: 'meter start',
  meterEnd: 'meter end',
  hours: 'hours',
  powerMachineId: 'power unit',
};

export interface EntryPreview {
  date: string;
  field: string;
  workType: string;
  powerUnit: string | null;
  implement: string | null;
  operatorEmail: string;
  hours: string;
  operatorHours: string | null;
  meterStart: string | null;
  meterEnd: string | null;
  acres: string | null;
  miles: string | null;
  loads: string | null;
  fuelGallons: string | null;
  billTo: string;
  notes: string | null;
}

export function resolveEntryRow(data: CsvDataRow, cat: ImportCatalogue): RowResult<EntryColumns, EntryPreview> {
  const r = new RowReader<EntryHeader>(data);
  const workDate = r.required('date', dateCell);
  const field = r.required('field', (t) => cat.fields.find(t));
  const workType = r.required('work type', (t) => cat.workTypes.find(t));
  const power = r.optional('power unit', (t) => cat.machines.find(t));
  const implement = r.optional('implement', (t) => cat.machines.find(t));
  const operator = r.required('operator email', (t) => cat.operators.find(t));
  const hours = r.optional('hours', num(HOURS));
  const meterStart = r.optional('meter start', num(METER));
  const meterEnd = r.optional('meter end', num(METER));
  const operatorHours = r.optional('operator hours', num(HOURS));
  const acres = r.optional('acres', num({ min: 0, max: 100_000, decimals: 3 }));
  const miles = r.optional('miles', num({ min: 0, max: 10_000, decimals: 3 }));
  const loads = r.optional('loads', num({ min: 0, max: 100_000, decimals: 2 }));
  const fuelGallons = r.optional('fuel gallons', num({ min: 0, max: 10_000, decimals: 3 }));
  const billTo = r.required('bill to', (t) => cat.parties.find(t));
  const notes = r.optional('notes', (t) => ({ ok: true, value: t }));

  if (power?.kind === 'implement') r.problem('power unit', `${power.name} is an implement; put it in the implement column.`);
  if (implement && implement.kind !== 'implement') r.problem('implement', `${implement.name} is a power unit; put it in the power unit column.`);
  // In a file the meter start is never guessed: the reading before may be a later row of the same file.
  if (meterEnd && !meterStart && r.text('meter start') === '') r.problem('meter start', 'Give the meter start with the meter end.');
  if (r.problems.length > 0 || !workDate || !field || !workType || !operator || !billTo) return { problems: r.problems, resolved: null };

  const { columns, issues } = completeDraft(
    {
      workDate,
      operatorUserId: operator.userId,
      fieldId: field.id,
      workTypeId: workType.id,
      powerMachineId: power?.id ?? null,
      implementMachineId: implement?.id ?? null,
      meterStart,
      meterEnd,
      startedAt: null,
      endedAt: null,
      hours,
      operatorHours,
      acres,
      miles,
      loads,
      eachCount: null,
      fuelGallons,
      billToPartyId: billTo.id,
      notes,
    },
    field,
    undefined,
  );
  for (const issue of issues) r.problem(ENTRY_PATHS[issue.path] ?? '', issue.message);
  if (r.problems.length > 0) return { problems: r.problems, resolved: null };

  const preview: EntryPreview = {
    date: workDate,
    field: field.name,
    workType: workType.name,
    powerUnit: power?.name ?? null,
    implement: implement?.name ?? null,
    operatorEmail: operator.email,
    hours: columns.hours,
    operatorHours: columns.operatorHours,
    meterStart: columns.meterStart,
    meterEnd: columns.meterEnd,
    acres: columns.acres,
    miles: columns.miles,
    loads: columns.loads,
    fuelGallons: columns.fuelGallons,
    billTo: billTo.name,
    notes,
  };
  const keyParts = [workDate, field.id, workType.id, power?.id ?? null, implement?.id ?? null, operator.userId, decText(hours), decText(meterStart), decText(meterEnd), decText(operatorHours), decText(acres), decText(miles), decText(loads), decText(fuelGallons), billTo.id, notes];
  return { problems: [], resolved: { row: data.row, columns, preview, keyParts } };
}

export interface FuelColumns {
  machineId: string;
  incurredOn: string;
  amount: string;
  gallons: string;
  meterHours: string | null;
  vendor: string | null;
  paidByPartyId: string | null;
  notes: string | null;
}

export interface FuelPreview {
  date: string;
  machine: string;
  gallons: string;
  amount: string;
  vendor: string | null;
  paidBy: string | null;
  meterHours: string | null;
  notes: string | null;
}

export function resolveFuelRow(data: CsvDataRow, cat: ImportCatalogue): RowResult<FuelColumns, FuelPreview> {
  const r = new RowReader<FuelHeader>(data);
  const date = r.required('date', dateCell);
  const machine = r.required('machine', (t) => cat.machines.find(t));
  const gallons = r.required('gallons', num({ min: 0, max: 10_000, decimals: 3, positive: true }));
  const amount = r.required('amount', num({ min: 0, max: 1_000_000, decimals: 2, money: true }));
  const vendor = r.optional('vendor', (t) => singleLineCell(t, 200));
  const paidBy = r.optional('paid by', (t) => cat.households.find(t));
  const meterHours = r.optional('meter hours', num(METER));
  const notes = r.optional('notes', (t) => ({ ok: true, value: t }));
  if (machine?.kind === 'implement') r.problem('machine', `${machine.name} is an implement; fuel goes to the machine with the engine.`);
  if (r.problems.length > 0 || !date || !machine || !gallons || !amount) return { problems: r.problems, resolved: null };

  const columns: FuelColumns = {
    machineId: machine.id,
    incurredOn: date,
    amount: amount.toFixed(2),
    gallons: gallons.toFixed(),
    meterHours: decText(meterHours),
    vendor,
    paidByPartyId: paidBy?.id ?? null,
    notes,
  };
  const preview: FuelPreview = { date, machine: machine.name, gallons: columns.gallons, amount: columns.amount, vendor, paidBy: paidBy?.name ?? null, meterHours: columns.meterHours, notes };
  const keyParts = [date, machine.id, gallons.toFixed(), amount.toFixed(2), vendor?.toLowerCase() ?? null, paidBy?.id ?? null, decText(meterHours), notes];
  return { problems: [], resolved: { row: data.row, columns, preview, keyParts } };
}
