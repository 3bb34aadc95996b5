import type { RateSheetDto, RateSheetListItemDto } from '@hitchbook/shared/schemas/rate-sheets';
import type { RateSheet } from '@hitchbook/db';
import type { LoadedSheet } from './rate-sheets.repository.js';

function sheetFields(s: RateSheet, partyName: string | null): Omit<RateSheetDto, 'lines' | 'machineRates'> {
  return {
    id: s.id,
    name: s.name,
    relationship: s.relationship,
    partyId: s.partyId,
    partyName,
    effectiveFrom: s.effectiveFrom,
    minimumCharge: s.minimumCharge,
    minimumPer: s.minimumPer,
    travelFlat: s.travelFlat,
    travelPerMile: s.travelPerMile,
    fuelAdjustment:
      s.fuelBasePrice !== null && s.fuelStep !== null && s.fuelAdjustPctPerStep !== null
        ? { basePricePerGallon: s.fuelBasePrice, stepPerGallon: s.fuelStep, pctPerStep: s.fuelAdjustPctPerStep }
        : null,
    operatorWage: s.operatorWage,
    laborFactor: s.laborFactor,
    termsDays: s.termsDays,
    notes: s.notes,
    archivedAt: s.archivedAt?.toISOString() ?? null,
    createdAt: s.createdAt.toISOString(),
    updatedAt: s.updatedAt.toISOString(),
  };
}

export function toRateSheetDto(loaded: LoadedSheet): RateSheetDto {
  return {
    ...sheetFields(loaded.sheet, loaded.partyName),
    lines: loaded.lines.map((l) => ({
      id: l.id,
      workTypeId: l.workTypeId,
      workTypeName: l.workTypeName,
      unit: l.unit,
      chargeType: l.chargeType,
      rate: l.rate,
      minimumCharge: l.minimumCharge,
    })),
    machineRates: loaded.machineRates.map((m) => ({ id: m.id, machineId: m.machineId, machineName: m.machineName, ratePerHour: m.ratePerHour })),
  };
}

export function toRateSheetListItem(row: { sheet: RateSheet; partyName: string | null; lineCount: number }): RateSheetListItemDto {
  return { ...sheetFields(row.sheet, row.partyName), lineCount: row.lineCount };
}
