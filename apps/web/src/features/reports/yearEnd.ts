import { COST_CATEGORIES, type CostCategory } from '@hitchbook/shared/actual-rate';
import type { CostPerHourPointDto, EstimateInputDto, MachineHoursHistoryDto, MachineRateFlagCode, MachineRateRowDto } from '@hitchbook/shared/schemas/reports';

/** The year in the URL when it is one the reports accept, else the current one. */
export function yearFromParam(raw: string | null, thisYear: number): number {
  const year = Number(raw);
  return Number.isInteger(year) && year >= 2000 && year <= thisYear ? year : thisYear;
}

/** Years with work entries, plus the current one, newest first. */
export function yearOptions(yearsWithEntries: readonly number[], thisYear: number): number[] {
  return [...new Set([thisYear, ...yearsWithEntries.filter((y) => y <= thisYear)])].sort((a, b) => b - a);
}

export const FLAG_LABELS: Record<MachineRateFlagCode, string> = {
  'actual-above-estimate': 'Above estimate',
  'below-break-even': 'Below break-even',
};

/**
 * Stacked cost-per-hour bars: numbers for plotting only. Categories nobody spent on are left out,
 * so the legend names only what is drawn.
 */
export function costPerHourChart(points: readonly CostPerHourPointDto[]): { data: Array<Record<string, string | number>>; categories: CostCategory[] } {
  const categories = COST_CATEGORIES.filter((c) => points.some((p) => Number(p[c]) !== 0));
  const data = points.map((p) => {
    const row: Record<string, string | number> = { name: p.name };
    for (const c of categories) row[c] = Number(p[c]);
    return row;
  });
  return { data, categories };
}

/** One row per machine that worked in any year, one bar per year: numbers for plotting only. */
export function hoursPerYearChart(history: MachineHoursHistoryDto): { data: Array<Record<string, string | number>>; years: string[] } {
  const years = history.years.map(String);
  const data = history.machines
    .filter((m) => m.hours.some((h) => Number(h) !== 0))
    .map((m) => {
      const row: Record<string, string | number> = { name: m.name };
      years.forEach((year, i) => {
        row[year] = Number(m.hours[i] ?? 0);
      });
      return row;
    });
  return { data, years };
}

/** Machines whose suggestion the owner can put on next year's sheet. */
export function acceptableMachines(rows: readonly MachineRateRowDto[]): MachineRateRowDto[] {
  return rows.filter((r) => r.suggestedRate !== null && r.status === 'active');
}

export const INPUT_LABELS: Record<string, string> = {
  machineClass: 'Machine class',
  listPrice: 'List price',
  purchasePrice: 'Purchase price',
  yearsOwned: 'Years owned',
  hoursPerYear: 'Hours a year',
  repairFactor1: 'Repair factor RF1',
  repairFactor2: 'Repair factor RF2',
  laborWagePerHour: 'Operator wage per hour',
  laborFactor: 'Labour hours per machine hour',
  ageAtPurchase: 'Age at purchase (years)',
  hoursAtPurchase: 'Hours at purchase',
  interestRatePct: 'Interest rate (%)',
  tihPct: 'Taxes, insurance, housing (% of price)',
};

export const INPUT_SOURCE_LABELS: Record<EstimateInputDto['source'], string> = {
  machine: 'Machine record',
  'year-records': 'The year’s records',
  'rate-sheet': 'Family rate sheet',
  'class-default': 'Class default',
  'method-default': 'Method default',
  query: 'Chosen here',
};

export function inputLabel(input: EstimateInputDto): string {
  return INPUT_LABELS[input.name] ?? input.name;
}
