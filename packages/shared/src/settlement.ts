import type { Decimal } from 'decimal.js';
import { householdBalancesOrThrow, type Balances, type SharedCost } from './cost-sharing.js';
import type { DecimalInput } from './decimal.js';
import { ComputationError } from './errors.js';
import { fromCents, toCentsOrThrow } from './money.js';

export interface Balance {
  householdId: string;
  // Positive: the household is owed money; negative: it owes.
  balance: DecimalInput;
}

export interface Transfer {
  from: string;
  to: string;
  amount: Decimal;
}

interface Position {
  householdId: string;
  order: number;
  cents: bigint;
}

// Up to this many households with open balances, the fewest transfers are
// found exactly (2^n subsets); beyond it a greedy match is used. Households
// sharing machines are rarely more than a handful.
export const EXACT_SETTLEMENT_LIMIT = 12;

// Settles a set of balances that sum to zero with as few transfers as can be:
// n households in k groups that each sum to zero need n − k transfers, so the
// work is finding the most such groups; each group is then settled by matching
// its largest creditor with its largest debtor until all are square.
export function settleBalancesOrThrow(balances: readonly Balance[]): Transfer[] {
  const positions = balances.map(
    (entry, order): Position => ({ householdId: entry.householdId, order, cents: toCentsOrThrow(entry.balance) }),
  );
  const net = positions.reduce((sum, position) => sum + position.cents, 0n);
  if (net !== 0n) {
    throw new ComputationError('unbalanced-balances', `balances must sum to zero, they sum to ${fromCents(net).toFixed(2)}`);
  }
  const open = positions.filter((position) => position.cents !== 0n);
  const groups = open.length <= EXACT_SETTLEMENT_LIMIT ? mostZeroSumGroups(open) : exactPairsThenRest(open);
  return groups.flatMap(settleGroupGreedily);
}

// Dynamic programme over subsets: best[mask] is the most zero-sum groups an
// ordering of mask's members can close; a prefix that sums to zero closes one.
function mostZeroSumGroups(open: readonly Position[]): Position[][] {
  const size = 1 << open.length;
  const sums = new Array<bigint>(size).fill(0n);
  const best = new Uint8Array(size);
  for (let mask = 1; mask < size; mask++) {
    const lowest = mask & -mask;
    sums[mask] = sums[mask ^ lowest]! + open[31 - Math.clz32(lowest)]!.cents;
    let most = 0;
    for (let bit = 1; bit <= mask; bit <<= 1) {
      if (mask & bit) most = Math.max(most, best[mask ^ bit]!);
    }
    best[mask] = most + (sums[mask] === 0n ? 1 : 0);
  }

  const closedMasks: number[] = [];
  let mask = size - 1;
  while (mask !== 0) {
    const closes = sums[mask] === 0n ? 1 : 0;
    if (closes) closedMasks.push(mask);
    const target = best[mask]! - closes;
    let bit = 1;
    while (!(mask & bit) || best[mask ^ bit] !== target) bit <<= 1;
    mask ^= bit;
  }
  return closedMasks.map((closed, index) => {
    const inner = closedMasks[index + 1] ?? 0;
    return open.filter((_, position) => (closed & ~inner & (1 << position)) !== 0);
  });
}

// For many households: settle every creditor whose balance exactly mirrors a
// debtor's in one payment, then treat the rest as a single group.
function exactPairsThenRest(open: readonly Position[]): Position[][] {
  const groups: Position[][] = [];
  const remaining = [...open];
  for (let index = 0; index < remaining.length; index++) {
    const creditor = remaining[index]!;
    if (creditor.cents <= 0n) continue;
    const match = remaining.findIndex((candidate) => candidate.cents === -creditor.cents);
    if (match === -1) continue;
    groups.push([creditor, remaining[match]!]);
    remaining.splice(Math.max(index, match), 1);
    remaining.splice(Math.min(index, match), 1);
    index = -1;
  }
  if (remaining.length > 0) groups.push(remaining);
  return groups;
}

function byLargestThenOrder(a: { cents: bigint; order: number }, b: { cents: bigint; order: number }): number {
  return a.cents === b.cents ? a.order - b.order : a.cents > b.cents ? -1 : 1;
}

// Each payment squares at least one household, so a group of m settles in at most m − 1.
function settleGroupGreedily(group: readonly Position[]): Transfer[] {
  const creditors = group.filter((p) => p.cents > 0n).map((p) => ({ ...p }));
  const debtors = group.filter((p) => p.cents < 0n).map((p) => ({ ...p, cents: -p.cents }));
  const transfers: Transfer[] = [];
  while (creditors.length > 0 && debtors.length > 0) {
    creditors.sort(byLargestThenOrder);
    debtors.sort(byLargestThenOrder);
    const creditor = creditors[0]!;
    const debtor = debtors[0]!;
    const cents = creditor.cents < debtor.cents ? creditor.cents : debtor.cents;
    transfers.push({ from: debtor.householdId, to: creditor.householdId, amount: fromCents(cents) });
    creditor.cents -= cents;
    debtor.cents -= cents;
    if (creditor.cents === 0n) creditors.shift();
    if (debtor.cents === 0n) debtors.shift();
  }
  return transfers;
}

export interface SquareUp extends Balances {
  transfers: Transfer[];
}

// The period's square-up: who paid what, who owes what, and the payments that clear it.
export function squareUpOrThrow(householdIds: readonly string[], costs: readonly SharedCost[]): SquareUp {
  const balances = householdBalancesOrThrow(householdIds, costs);
  const transfers = settleBalancesOrThrow(
    balances.households.map((row) => ({ householdId: row.householdId, balance: row.balance })),
  );
  return { ...balances, transfers };
}
