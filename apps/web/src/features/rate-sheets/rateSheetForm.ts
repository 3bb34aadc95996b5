import type {
  ChargeTypeName,
  RateRelationship,
  RateSheetCreateInput,
  RateSheetDto,
} from '@hitchbook/shared/schemas/rate-sheets';
import type { WorkUnit } from '@hitchbook/shared/work-types';

export interface RateLineValues {
  /** Keeps a row's identity while rows are added and removed; never sent. */
  key: string;
  workTypeId: string;
  unit: WorkUnit;
  chargeType: ChargeTypeName;
  rate: string;
  minimumCharge: string;
}

export interface MachineRateValues {
  key: string;
  machineId: string;
  ratePerHour: string;
}

/** Every field as typed, so decimals stay text until the server reads them. */
export interface RateSheetFormValues {
  name: string;
  relationship: RateRelationship;
  partyId: string;
  effectiveFrom: string;
  minimumCharge: string;
  minimumPer: 'entry' | 'visit';
  travelFlat: string;
  travelPerMile: string;
  adjustsForFuel: boolean;
  fuelAdjustment: { basePricePerGallon: string; stepPerGallon: string; pctPerStep: string };
  operatorWage: string;
  laborFactor: string;
  termsDays: string;
  notes: string;
  lines: RateLineValues[];
  machineRates: MachineRateValues[];
}

let nextKey = 0;
export function rowKey(): string {
  nextKey += 1;
  return `row-${nextKey}`;
}

export function emptyLine(): RateLineValues {
  return { key: rowKey(), workTypeId: '', unit: 'acre', chargeType: 'custom', rate: '', minimumCharge: '' };
}

export function emptyMachineRate(): MachineRateValues {
  return { key: rowKey(), machineId: '', ratePerHour: '' };
}

export function newSheetValues(today: string): RateSheetFormValues {
  return {
    name: '',
    relationship: 'neighbour',
    partyId: '',
    effectiveFrom: today,
    minimumCharge: '0',
    minimumPer: 'entry',
    travelFlat: '0',
    travelPerMile: '0',
    adjustsForFuel: false,
    fuelAdjustment: { basePricePerGallon: '', stepPerGallon: '', pctPerStep: '' },
    operatorWage: '0',
    laborFactor: '1.1',
    termsDays: '30',
    notes: '',
    lines: [emptyLine()],
    machineRates: [],
  };
}

export function valuesFromSheet(sheet: RateSheetDto): RateSheetFormValues {
  return {
    name: sheet.name,
    relationship: sheet.relationship,
    partyId: sheet.partyId ?? '',
    effectiveFrom: sheet.effectiveFrom,
    minimumCharge: sheet.minimumCharge,
    minimumPer: sheet.minimumPer,
    travelFlat: sheet.travelFlat,
    travelPerMile: sheet.travelPerMile,
    adjustsForFuel: sheet.fuelAdjustment !== null,
    fuelAdjustment: sheet.fuelAdjustment ?? { basePricePerGallon: '', stepPerGallon: '', pctPerStep: '' },
    operatorWage: sheet.operatorWage,
    laborFactor: sheet.laborFactor,
    termsDays: String(sheet.termsDays),
    notes: sheet.notes ?? '',
    lines: sheet.lines.map((l) => ({
      key: rowKey(),
      workTypeId: l.workTypeId,
      unit: l.unit,
      chargeType: l.chargeType,
      rate: l.rate,
      minimumCharge: l.minimumCharge ?? '',
    })),
    machineRates: sheet.machineRates.map((m) => ({ key: rowKey(), machineId: m.machineId, ratePerHour: m.ratePerHour })),
  };
}

/** Days are a count, not money; a blank or non-number becomes NaN so the schema asks for a whole number. */
function daysFrom(text: string): number {
  return text.trim() === '' ? Number.NaN : Number(text);
}

/** The request body for both create and edit: the whole sheet, lists replaced as a whole. */
export function toRateSheetPayload(values: RateSheetFormValues): RateSheetCreateInput {
  return {
    name: values.name,
    relationship: values.relationship,
    partyId: values.partyId || null,
    effectiveFrom: values.effectiveFrom,
    minimumCharge: values.minimumCharge,
    minimumPer: values.minimumPer,
    travelFlat: values.travelFlat,
    travelPerMile: values.travelPerMile,
    fuelAdjustment: values.adjustsForFuel ? { ...values.fuelAdjustment } : null,
    operatorWage: values.operatorWage,
    laborFactor: values.laborFactor,
    termsDays: daysFrom(values.termsDays),
    notes: values.notes.trim() ? values.notes : null,
    lines: values.lines.map((l) => ({
      workTypeId: l.workTypeId,
      unit: l.unit,
      chargeType: l.chargeType,
      rate: l.rate,
      minimumCharge: l.minimumCharge.trim() ? l.minimumCharge : null,
    })),
    machineRates: values.machineRates.map((m) => ({ machineId: m.machineId, ratePerHour: m.ratePerHour })),
  };
}
