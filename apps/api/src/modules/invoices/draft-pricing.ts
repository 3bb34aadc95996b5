import type { Decimal } from 'decimal.js';
import { Dec } from '@hitchbook/shared/decimal';
import { ComputationError } from '@hitchbook/shared/errors';
import { toMoneyString } from '@hitchbook/shared/money';
import { priceVisitOrThrow, type LineItem, type Rate, type RateSheet as EngineSheet, type RateUnit } from '@hitchbook/shared/pricing';
import type { FieldIssue } from '../../common/errors/app-error.js';
import type { LoadedSheet } from '../rate-sheets/rate-sheets.repository.js';
import { sheetInForce } from '../rate-sheets/sheet-choice.js';

/** An approved work entry as the draft sees it. */
export interface EntryToBill {
  id: string;
  version: number;
  workDate: string;
  workTypeId: string;
  workTypeName: string;
  defaultUnit: RateUnit;
  fieldName: string;
  hours: string;
  acres: string | null;
  miles: string | null;
  loads: string | null;
  eachCount: string | null;
}

export interface PricingOptions {
  dieselPricePerGallon?: Decimal;
  travelMilesPerVisit?: Decimal;
}

export type PricedLineKind = 'work' | 'minimum' | 'travel' | 'fuel-adjustment' | 'labour';

/** A draft line priced by the engine, ready to be stored; `quantity` and `rate` fit their columns. */
export interface PricedLine {
  kind: PricedLineKind;
  workEntryId: string | null;
  workDate: string;
  description: string;
  fieldName: string | null;
  workTypeName: string | null;
  quantity: string;
  unit: string;
  rate: string;
  amount: string;
  details: { rateSheetId: string; rateSheetName: string; chargeType: string | null; entryVersion: number | null; exactQuantity: string };
}

export type DraftPricing = { ok: true; lines: PricedLine[]; subtotal: string; termsDays: number } | { ok: false; issues: FieldIssue[] };

const KIND_OF: Record<LineItem['kind'], PricedLineKind> = {
  work: 'work',
  'fuel-adjustment': 'fuel-adjustment',
  'operator-labor': 'labour',
  'minimum-charge': 'minimum',
  'travel-flat': 'travel',
  'travel-mileage': 'travel',
};

function quantityOf(entry: EntryToBill, unit: RateUnit): string | null {
  switch (unit) {
    case 'acre':
      return entry.acres;
    case 'hour':
      return entry.hours;
    case 'mile':
      return entry.miles;
    case 'load':
      return entry.loads;
    case 'each':
      return entry.eachCount;
  }
}

const UNIT_WORDS: Record<RateUnit, string> = { acre: 'acres', hour: 'hours', mile: 'miles', load: 'loads', each: 'pieces' };

/**
 * The sheet's line for a work type: in the work type's usual unit when the sheet has one, and custom
 * work before rental (the outfit's own operator runs the machine unless the sheet only rents it out).
 */
export function lineForWorkType(loaded: LoadedSheet, workTypeId: string, defaultUnit: RateUnit): LoadedSheet['lines'][number] | null {
  const candidates = loaded.lines
    .filter((l) => l.workTypeId === workTypeId)
    .sort((a, b) => Number(b.unit === defaultUnit) - Number(a.unit === defaultUnit) || Number(a.chargeType === 'rental') - Number(b.chargeType === 'rental'));
  return candidates[0] ?? null;
}

function engineRate(loaded: LoadedSheet, line: LoadedSheet['lines'][number], label: string): Rate {
  const s = loaded.sheet;
  const lineMinimum = line.minimumCharge ?? (new Dec(s.minimumCharge).gt(0) ? s.minimumCharge : null);
  const withOperator = line.chargeType === 'rental' && new Dec(s.operatorWage).gt(0);
  return {
    workTypeId: line.workTypeId,
    label,
    unit: line.unit,
    chargeType: line.chargeType,
    pricePerUnit: line.rate,
    ...(lineMinimum ? { minimumCharge: { amount: lineMinimum, per: s.minimumPer } } : {}),
    ...(withOperator ? { operator: { wagePerHour: s.operatorWage, laborFactor: s.laborFactor } } : {}),
  };
}

function engineSheet(loaded: LoadedSheet, rates: Rate[]): EngineSheet {
  const s = loaded.sheet;
  const fuel =
    s.fuelBasePrice !== null && s.fuelStep !== null && s.fuelAdjustPctPerStep !== null
      ? { baseDieselPricePerGallon: s.fuelBasePrice, stepPerGallon: s.fuelStep, change: { kind: 'percent' as const, pctPerStep: s.fuelAdjustPctPerStep } }
      : undefined;
  return { kind: s.relationship, rates, travel: { flatPerVisit: s.travelFlat, perMile: s.travelPerMile }, ...(fuel ? { fuelAdjustment: fuel } : {}) };
}

interface Visit {
  loaded: LoadedSheet;
  workDate: string;
  entries: Array<{ entry: EntryToBill; line: LoadedSheet['lines'][number]; quantity: string }>;
}

/**
 * Prices a party's entries line by line with the engine. A visit is one day's work for the party under
 * one sheet: travel and per-visit minimums are charged once per visit. Every entry that cannot be
 * priced is reported (no sheet in force, no rate, no quantity in the rate's unit), never skipped.
 */
export function priceDraft(party: { id: string; relationship: 'family' | 'neighbour' | 'agency' }, entries: EntryToBill[], sheets: LoadedSheet[], options: PricingOptions): DraftPricing {
  const issues: FieldIssue[] = [];
  const visits = new Map<string, Visit>();
  const sorted = [...entries].sort((a, b) => a.workDate.localeCompare(b.workDate) || a.fieldName.localeCompare(b.fieldName) || a.id.localeCompare(b.id));
  for (const entry of sorted) {
    const path = `entries.${entry.id}`;
    const choice = sheetInForce(sheets, party, entry.workDate, (l) => l.sheet);
    if (!choice) {
      issues.push({ path, message: `No rate sheet is in force on ${entry.workDate} for this party.` });
      continue;
    }
    const line = lineForWorkType(choice.sheet, entry.workTypeId, entry.defaultUnit);
    if (!line) {
      issues.push({ path, message: `"${choice.sheet.sheet.name}" has no rate for ${entry.workTypeName}.` });
      continue;
    }
    const quantity = quantityOf(entry, line.unit);
    if (quantity === null) {
      issues.push({ path, message: `The entry of ${entry.workDate} on ${entry.fieldName} has no ${UNIT_WORDS[line.unit]} to bill per ${line.unit}.` });
      continue;
    }
    const key = `${choice.sheet.sheet.id}|${entry.workDate}`;
    const visit = visits.get(key) ?? { loaded: choice.sheet, workDate: entry.workDate, entries: [] };
    visit.entries.push({ entry, line, quantity });
    visits.set(key, visit);
  }
  if (issues.length > 0) return { ok: false, issues };

  const lines: PricedLine[] = [];
  let termsDays = 30;
  for (const visit of [...visits.values()].sort((a, b) => a.workDate.localeCompare(b.workDate))) {
    const rates = new Map<string, Rate>();
    for (const { entry, line } of visit.entries) rates.set(entry.workTypeId, engineRate(visit.loaded, line, entry.workTypeName));
    let priced;
    try {
      priced = priceVisitOrThrow(engineSheet(visit.loaded, [...rates.values()]), {
        visitId: `${visit.loaded.sheet.id}:${visit.workDate}`,
        partyId: party.id,
        ...(options.dieselPricePerGallon ? { dieselPricePerGallon: options.dieselPricePerGallon } : {}),
        ...(options.travelMilesPerVisit ? { travelMiles: options.travelMilesPerVisit } : {}),
        entries: visit.entries.map(({ entry, line, quantity }) => ({
          entryId: entry.id,
          workTypeId: entry.workTypeId,
          quantity,
          machineHours: entry.hours,
          withOperator: line.chargeType === 'rental',
        })),
      });
    } catch (err) {
      if (err instanceof ComputationError && err.code === 'missing-diesel-price') {
        return { ok: false, issues: [{ path: 'dieselPricePerGallon', message: `"${visit.loaded.sheet.name}" adjusts for fuel; give the diesel price per gallon.` }] };
      }
      throw err;
    }
    const byId = new Map(visit.entries.map((e) => [e.entry.id, e]));
    for (const item of priced.lines) {
      const billed = item.entryId ? byId.get(item.entryId) : undefined;
      const quantity = new Dec(item.quantity);
      lines.push({
        kind: KIND_OF[item.kind],
        workEntryId: item.entryId,
        workDate: visit.workDate,
        description: item.label,
        fieldName: billed?.entry.fieldName ?? null,
        workTypeName: billed?.entry.workTypeName ?? (item.workTypeId ? (visit.entries.find((e) => e.entry.workTypeId === item.workTypeId)?.entry.workTypeName ?? null) : null),
        // The columns keep 3 and 4 places; the engine's exact quantity stays in the details.
        quantity: quantity.toDecimalPlaces(3).toFixed(),
        unit: item.unit,
        rate: new Dec(item.unitPrice).toDecimalPlaces(4).toFixed(),
        amount: item.amount,
        details: {
          rateSheetId: visit.loaded.sheet.id,
          rateSheetName: visit.loaded.sheet.name,
          chargeType: billed?.line.chargeType ?? null,
          entryVersion: billed?.entry.version ?? null,
          exactQuantity: item.quantity,
        },
      });
    }
    // The terms of the sheet that priced the latest work.
    termsDays = visit.loaded.sheet.termsDays;
  }
  const subtotal = toMoneyString(lines.reduce<Decimal>((sum, l) => sum.plus(l.amount), new Dec(0)));
  return { ok: true, lines, subtotal, termsDays };
}
