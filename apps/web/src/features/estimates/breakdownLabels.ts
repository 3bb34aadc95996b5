import type { BreakdownKey } from './api/estimateMachineCost';

export const BREAKDOWN_LABELS: Record<BreakdownKey, string> = {
  capitalRecovery: 'Depreciation and interest',
  tih: 'Taxes, insurance, housing',
  ownership: 'Ownership cost',
  repairs: 'Repairs and maintenance',
  fuel: 'Fuel',
  lube: 'Lubrication',
  labor: 'Labour',
  operating: 'Operating cost',
  total: 'Total cost',
};

/** Subtotals are printed bold and are left out of the stacked chart, which shows only their parts. */
export const SUBTOTAL_KEYS: readonly BreakdownKey[] = ['ownership', 'operating', 'total'];

export const OWNERSHIP_PARTS = ['capitalRecovery', 'tih'] as const satisfies readonly BreakdownKey[];
export const OPERATING_PARTS = ['repairs', 'fuel', 'lube', 'labor'] as const satisfies readonly BreakdownKey[];
