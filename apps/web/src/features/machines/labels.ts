import type { CostCategory } from '@hitchbook/shared/actual-rate';
import type { MachineKind } from '@hitchbook/shared/machine-classes';
import type { MachineStatus, MeterReadingDto } from '@hitchbook/shared/schemas/machines';

export const STATUS_LABELS: Record<MachineStatus, string> = { active: 'Active', sold: 'Sold', retired: 'Retired' };

export const STATUS_COLORS: Record<MachineStatus, string> = { active: 'harbor', sold: 'slate', retired: 'clay' };

export const KIND_LABELS: Record<MachineKind, string> = {
  power: 'Power unit',
  'self-propelled': 'Self-propelled',
  implement: 'Implement',
};

export const FUEL_LABELS = { diesel: 'Diesel', gasoline: 'Gasoline', lpg: 'LPG' } as const;

export const COST_CATEGORY_LABELS: Record<CostCategory, string> = {
  fuel: 'Fuel',
  repair: 'Repair',
  parts: 'Parts',
  tires: 'Tires',
  insurance: 'Insurance',
  taxes: 'Taxes',
  housing: 'Housing',
  interest: 'Interest',
  improvement: 'Improvement',
};

export const READING_SOURCE_LABELS: Record<MeterReadingDto['source'], string> = {
  manual: 'Read by hand',
  'work-entry': 'Work entry',
  'cost-entry': 'Cost entry',
  import: 'Import',
};

/** The parts of the published-method estimate, per hour. */
export const ESTIMATE_PART_LABELS = {
  capitalRecovery: 'Capital recovery',
  tih: 'Taxes, insurance, housing',
  ownership: 'Ownership',
  repairs: 'Repairs',
  fuel: 'Fuel',
  lube: 'Lubrication',
  labor: 'Labour',
  operating: 'Operating',
  total: 'Total',
} as const;

export const ENTRY_STATE_LABELS = {
  draft: 'Draft',
  submitted: 'Submitted',
  approved: 'Approved',
  invoiced: 'On invoice',
  squared: 'Squared up',
} as const;
