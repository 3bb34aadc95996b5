import { Decimal } from 'decimal.js';
import type {
  StatementCostLineDto,
  StatementHouseholdDto,
  StatementLineKind,
  StatementWorkLineDto,
} from '@hitchbook/shared/schemas/square-ups';

export const HOUSEHOLD_FIGURES = ['paid', 'share', 'useCharged', 'useCredited', 'balance'] as const;
export type HouseholdFigure = (typeof HOUSEHOLD_FIGURES)[number];

export const FIGURE_LABELS: Record<HouseholdFigure, string> = {
  paid: 'Paid',
  share: 'Share',
  useCharged: 'Use charged',
  useCredited: 'Use credited',
  balance: 'Balance',
};

/** Column totals of the households table; the balance total is zero when the statement squares. */
export function householdTotals(households: readonly StatementHouseholdDto[]): Record<HouseholdFigure, string> {
  const totals = {} as Record<HouseholdFigure, string>;
  for (const figure of HOUSEHOLD_FIGURES) {
    totals[figure] = households.reduce((sum, h) => sum.plus(h[figure]), new Decimal(0)).toFixed(2);
  }
  return totals;
}

/** Chart rows: numbers for plotting only, every printed figure stays a decimal string. */
export function balanceBars(households: readonly StatementHouseholdDto[]): Array<{ name: string; balance: number }> {
  return households.map((h) => ({ name: h.name, balance: Number(h.balance) }));
}

/** Costs explain what a household paid and its share; work entries explain its use charges and credits. */
export function linesKindFor(figure: HouseholdFigure): StatementLineKind {
  return figure === 'useCharged' || figure === 'useCredited' ? 'work' : 'cost';
}

export type LineRole = 'paid' | 'share' | 'charged' | 'credited' | 'own-use';

export const LINE_ROLE_LABELS: Record<LineRole, string> = {
  paid: 'Paid',
  share: 'Share',
  charged: 'Use charged',
  credited: 'Use credited',
  'own-use': 'Own use',
};

/** Which of a household's figures a cost entry counts in (the server sets the flags when a household is asked for). */
export function costLineRoles(line: StatementCostLineDto): LineRole[] {
  const roles: LineRole[] = [];
  if (line.paidByHousehold) roles.push('paid');
  if (line.bearsShare) roles.push('share');
  return roles;
}

/**
 * Which of a household's figures a machine's hours count in: its own use of a machine it did not
 * own is charged, another household's use of a machine it owned is credited to it, and its use of
 * its own machine weighs its share of the operating costs.
 */
export function workLineRole(line: StatementWorkLineDto, householdId: string): LineRole {
  if (line.householdId !== householdId) return 'credited';
  return line.userOwned ? 'own-use' : 'charged';
}
