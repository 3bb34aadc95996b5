import type { CostCategory } from '@hitchbook/shared/actual-rate';

/** Chart colours per cost category: fixed costs in teal, operating costs in clay, so the stacks read as two families. */
export const CATEGORY_COLORS: Record<CostCategory, string> = {
  insurance: 'harbor.9',
  taxes: 'harbor.7',
  housing: 'harbor.5',
  interest: 'harbor.3',
  improvement: 'slate.6',
  fuel: 'clay.8',
  repair: 'clay.6',
  parts: 'clay.4',
  tires: 'clay.2',
};

/** Bars for up to four years, oldest palest. */
export const YEAR_COLORS = ['slate.3', 'harbor.3', 'harbor.5', 'harbor.8'] as const;
