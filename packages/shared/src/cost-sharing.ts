import type { Decimal } from 'decimal.js';
import { Dec, parseDecimalOrThrow, type DecimalInput } from './decimal.js';
import { ComputationError } from './errors.js';
import { allocateOrThrow, roundToCent, toCentsOrThrow } from './money.js';

export interface OwnershipShare {
  householdId: string;
  ownershipPct: DecimalInput;
}

export interface UseShare {
  householdId: string;
  // Hours or acres, as long as every household is measured the same way.
  use: DecimalInput;
}

export type ShareBasis =
  | { by: 'ownership'; owners: readonly OwnershipShare[] }
  | { by: 'use'; users: readonly UseShare[] };

export interface HouseholdAmount {
  householdId: string;
  amount: Decimal;
}

export interface SharedCost {
  label: string;
  amount: DecimalInput;
  // What each household actually paid towards this cost.
  paidBy: Readonly<Record<string, DecimalInput>>;
  basis: ShareBasis;
}

export interface HouseholdBalance {
  householdId: string;
  paid: Decimal;
  share: Decimal;
  // paid − share: positive is owed to the household, negative is owed by it.
  balance: Decimal;
}

export interface Balances {
  totalCost: Decimal;
  households: HouseholdBalance[];
}

export function splitByOwnershipOrThrow(amount: DecimalInput, owners: readonly OwnershipShare[]): HouseholdAmount[] {
  const total = owners.reduce<Decimal>((sum, owner) => sum.plus(parseDecimalOrThrow(owner.ownershipPct, 'ownershipPct')), new Dec(0));
  if (!total.eq(100)) {
    throw new ComputationError('invalid-argument', `ownership must add up to 100 %, it adds up to ${total.toString()} %`);
  }
  const parts = allocateOrThrow(amount, owners.map((owner) => owner.ownershipPct));
  return owners.map((owner, index) => ({ householdId: owner.householdId, amount: parts[index]! }));
}

export function splitByUseOrThrow(amount: DecimalInput, users: readonly UseShare[]): HouseholdAmount[] {
  const parts = allocateOrThrow(amount, users.map((user) => user.use));
  return users.map((user, index) => ({ householdId: user.householdId, amount: parts[index]! }));
}

export function splitCostOrThrow(amount: DecimalInput, basis: ShareBasis): HouseholdAmount[] {
  return basis.by === 'ownership' ? splitByOwnershipOrThrow(amount, basis.owners) : splitByUseOrThrow(amount, basis.users);
}

export interface MachineUse {
  label: string;
  usedBy: string;
  hours: DecimalInput;
  // The machine's own cost per hour (estimate or actual rate).
  hourlyRate: DecimalInput;
  owners: readonly OwnershipShare[];
}

// A household's hours on a machine it does not (wholly) own become a cost that
// the owners "paid" by providing the machine and that falls on the user alone.
// A user who is also part-owner is credited with their own slice, so they end
// up owing the co-owners only for the part they do not own.
export function useChargeAsCostOrThrow(use: MachineUse): SharedCost {
  const amount = roundToCent(parseDecimalOrThrow(use.hours, 'hours').times(parseDecimalOrThrow(use.hourlyRate, 'hourlyRate')));
  const credits = splitByOwnershipOrThrow(amount, use.owners);
  return {
    label: use.label,
    amount,
    paidBy: Object.fromEntries(credits.map((credit) => [credit.householdId, credit.amount])),
    basis: { by: 'use', users: [{ householdId: use.usedBy, use: 1 }] },
  };
}

// Several costs on one basis, as one: splitting the pooled total once keeps the
// rounding to a single largest-remainder pass, as the joint-ownership planner promises.
export function poolCosts(label: string, costs: readonly Omit<SharedCost, 'basis'>[], basis: ShareBasis): SharedCost {
  const paidBy: Record<string, Decimal> = {};
  let amount = new Dec(0);
  for (const cost of costs) {
    amount = amount.plus(parseDecimalOrThrow(cost.amount, 'amount'));
    for (const [householdId, paid] of Object.entries(cost.paidBy)) {
      paidBy[householdId] = (paidBy[householdId] ?? new Dec(0)).plus(parseDecimalOrThrow(paid, 'paidBy'));
    }
  }
  return { label, amount, paidBy, basis };
}

function checkPaymentsOrThrow(cost: SharedCost, known: ReadonlySet<string>): void {
  let paid = new Dec(0);
  for (const [householdId, amount] of Object.entries(cost.paidBy)) {
    if (!known.has(householdId)) {
      throw new ComputationError('invalid-argument', `${cost.label}: "${householdId}" is not one of the households`);
    }
    paid = paid.plus(parseDecimalOrThrow(amount, 'paidBy'));
  }
  if (toCentsOrThrow(paid) !== toCentsOrThrow(cost.amount)) {
    throw new ComputationError('invalid-argument', `${cost.label}: payments add up to ${paid.toFixed(2)}, not ${parseDecimalOrThrow(cost.amount).toFixed(2)}`);
  }
}

// Every household's paid, share and balance; balances sum to zero to the cent
// because each cost's payments and shares both add up to that cost exactly.
export function householdBalancesOrThrow(householdIds: readonly string[], costs: readonly SharedCost[]): Balances {
  const known = new Set(householdIds);
  if (known.size !== householdIds.length) {
    throw new ComputationError('invalid-argument', 'each household may appear only once');
  }
  const rows = new Map(householdIds.map((householdId) => [householdId, { paid: new Dec(0), share: new Dec(0) }]));
  let totalCost = new Dec(0);
  for (const cost of costs) {
    checkPaymentsOrThrow(cost, known);
    totalCost = totalCost.plus(parseDecimalOrThrow(cost.amount, 'amount'));
    for (const [householdId, amount] of Object.entries(cost.paidBy)) {
      const row = rows.get(householdId)!;
      row.paid = row.paid.plus(parseDecimalOrThrow(amount, 'paidBy'));
    }
    for (const part of splitCostOrThrow(cost.amount, cost.basis)) {
      const row = rows.get(part.householdId);
      if (!row) {
        throw new ComputationError('invalid-argument', `${cost.label}: "${part.householdId}" is not one of the households`);
      }
      row.share = row.share.plus(part.amount);
    }
  }
  return {
    totalCost,
    households: householdIds.map((householdId) => {
      const { paid, share } = rows.get(householdId)!;
      return { householdId, paid, share, balance: paid.minus(share) };
    }),
  };
}
