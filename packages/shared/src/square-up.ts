import type { Decimal } from 'decimal.js';
import type { ActualRate, CostCategory } from './actual-rate.js';
import {
  poolCosts,
  splitCostOrThrow,
  useChargeAsCostOrThrow,
  type OwnershipShare,
  type ShareBasis,
} from './cost-sharing.js';
import { Dec, fixed, parseDecimalOrThrow } from './decimal.js';
import { toMoneyString } from './money.js';
import type {
  FixedCostsBy,
  SquareUpDto,
  SquareUpStatementDto,
  StatementHouseholdDto,
  StatementMachineDto,
  StatementPoolDto,
  StatementSplitDto,
  StatementTotalsDto,
  StatementTransferDto,
  StatementUseChargeDto,
  StatementWarningCode,
  StatementWarningDto,
} from './schemas/square-ups.js';
import { settleBalancesOrThrow } from './settlement.js';

// A period's square-up statement from figures already summed by the database: costs grouped by
// machine, kind, share set and payer; machine use grouped by machine, household, share set and rate.
// This file only applies the cost-sharing and settlement engine to those sums.

export const OPERATING_COST_CATEGORIES = ['fuel', 'repair', 'parts', 'tires'] as const satisfies readonly CostCategory[];
export const FIXED_COST_CATEGORIES = ['insurance', 'taxes', 'housing', 'interest', 'improvement'] as const satisfies readonly CostCategory[];
export type CostKind = 'fixed' | 'operating';

export interface StatementHousehold {
  id: string;
  name: string;
  archived: boolean;
}

export interface StatementMachine {
  id: string;
  name: string;
  /** The machine's actual cost per hour, used when no family rate sheet prices its use; null when unknown. */
  actualRatePerHour: string | null;
}

export interface StatementShareSet {
  machineId: string;
  effectiveFrom: string;
  shares: ReadonlyArray<{ partyId: string; sharePct: string }>;
}

export interface StatementCostGroup {
  machineId: string;
  costKind: CostKind;
  /** The share set in force on the costs' dates; null before the machine had owners. */
  shareSetFrom: string | null;
  paidByPartyId: string | null;
  amount: string;
  entries: number;
}

export interface StatementUseGroup {
  machineId: string;
  householdId: string;
  shareSetFrom: string | null;
  rateSheetId: string | null;
  /** The family sheet's machine-hour rate; null when the sheet has none for the machine. */
  ratePerHour: string | null;
  hours: string;
  entries: number;
}

export interface StatementInput {
  fixedCostsBy: FixedCostsBy;
  households: readonly StatementHousehold[];
  machines: readonly StatementMachine[];
  shareSets: readonly StatementShareSet[];
  costs: readonly StatementCostGroup[];
  uses: readonly StatementUseGroup[];
}

/** What the database sums for a period (see @hitchbook/db's square-up sums). */
export interface StatementSums {
  households: StatementHousehold[];
  machines: Array<{ id: string; name: string }>;
  shareSets: StatementShareSet[];
  costs: StatementCostGroup[];
  uses: StatementUseGroup[];
  /** Draft and submitted entries dated in the period. */
  pendingEntries: number;
}

export interface StatementFigures {
  households: StatementHouseholdDto[];
  machines: StatementMachineDto[];
  useCharges: StatementUseChargeDto[];
  transfers: StatementTransferDto[];
  totals: StatementTotalsDto;
  warnings: StatementWarningDto[];
}

export function squareUpRules(fixedCostsBy: FixedCostsBy): string[] {
  return [
    'A cost counts in the period it was paid; an improvement counts as yearly slices over its life, each dated a year after the last. A cost with no paying household is left out.',
    fixedCostsBy === 'ownership'
      ? 'Fixed costs (insurance, taxes, housing, interest, improvement slices) are split among the owners by the shares in force on the cost’s date.'
      : 'By agreement for this period, fixed costs are split like operating costs: by the owners’ hours on the machine.',
    'Operating costs (fuel, repair, parts, tires) are split among the owners by the hours each used the machine in the period; with no owner use they are split by shares.',
    'A household’s use is approved or squared work billed to it; work billed outside the households counts for the household that owns the field, invoiced or not. Each entry’s hours count for its power unit and its implement.',
    'Use of a machine the household did not own that day is charged at the machine-hour rate of the family rate sheet in force on the work date (without one, at the machine’s actual cost per hour for the year) and credited to the owners by their shares.',
    'Balance = paid − share + use credited − use charged. Balances sum to zero and are settled with the fewest transfers, exact to the cent.',
  ];
}

const hoursString = (value: Decimal) => fixed(value, 2);
const rateString = (value: Decimal) => fixed(value, value.decimalPlaces() <= 2 ? 2 : 4);

interface Tally {
  paid: Decimal;
  share: Decimal;
  useCharged: Decimal;
  useCredited: Decimal;
}

class Warnings {
  private readonly byKey = new Map<string, { code: StatementWarningCode; machineId: string | null; entries: number; amount: Decimal; hours: Decimal; about: string }>();

  add(code: StatementWarningCode, machineId: string | null, about: string, figures: { entries?: number; amount?: Decimal; hours?: Decimal }): void {
    const key = `${code}|${machineId ?? ''}|${about}`;
    const row = this.byKey.get(key) ?? { code, machineId, entries: 0, amount: new Dec(0), hours: new Dec(0), about };
    row.entries += figures.entries ?? 0;
    row.amount = row.amount.plus(figures.amount ?? 0);
    row.hours = row.hours.plus(figures.hours ?? 0);
    this.byKey.set(key, row);
  }

  list(machineName: (id: string | null) => string): StatementWarningDto[] {
    return [...this.byKey.values()].map((w) => ({ code: w.code, machineId: w.machineId, message: warningMessage(w, machineName(w.machineId)) }));
  }
}

function warningMessage(w: { code: StatementWarningCode; entries: number; amount: Decimal; hours: Decimal; about: string }, machine: string): string {
  const entries = `${w.entries} ${w.entries === 1 ? 'entry' : 'entries'}`;
  const are = w.entries === 1 ? 'is' : 'are';
  switch (w.code) {
    case 'cost-without-payer':
      return `${entries} of costs on ${machine} (${toMoneyString(w.amount)}) ${w.entries === 1 ? 'has' : 'have'} no paying household and ${are} left out; record who paid.`;
    case 'cost-without-owners':
      return `${entries} of costs on ${machine} (${toMoneyString(w.amount)}) ${are} dated before the machine had owners and ${are} left out.`;
    case 'use-without-owners':
      return `${hoursString(w.hours)} h on ${machine} were worked on days it had no owners and are not charged.`;
    case 'use-without-rate':
      return `${hoursString(w.hours)} h on ${machine} by ${w.about} are not charged: no family machine-hour rate and no actual cost per hour for the year.`;
    case 'share-set-invalid':
      return `The shares of ${machine} from ${w.about} do not add up to 100 % among households; its costs and use under them are left out.`;
    case 'entries-pending':
      return `${entries} dated in the period ${w.entries === 1 ? 'waits' : 'wait'} for approval and ${are} not counted.`;
  }
}

function shareKey(machineId: string, from: string): string {
  return `${machineId}|${from}`;
}

/** Share sets the engine can split by: every owner a household and the shares summing to 100. */
// Owners in the households' order, so splits and credits always list (and round) the same way.
function usableShareSets(input: StatementInput, households: ReadonlyMap<string, number>, warnings: Warnings): Map<string, OwnershipShare[] | null> {
  const sets = new Map<string, OwnershipShare[] | null>();
  for (const set of input.shareSets) {
    const total = set.shares.reduce((sum, share) => sum.plus(parseDecimalOrThrow(share.sharePct, 'sharePct')), new Dec(0));
    const usable = total.eq(100) && set.shares.every((share) => households.has(share.partyId));
    if (!usable) warnings.add('share-set-invalid', set.machineId, set.effectiveFrom, {});
    const owners = [...set.shares]
      .sort((a, b) => (households.get(a.partyId) ?? 0) - (households.get(b.partyId) ?? 0))
      .map((share) => ({ householdId: share.partyId, ownershipPct: share.sharePct }));
    sets.set(shareKey(set.machineId, set.effectiveFrom), usable ? owners : null);
  }
  return sets;
}

interface PoolDraft {
  basis: ShareBasis;
  shareSetFrom: string | null;
  kinds: Set<CostKind>;
  reason: StatementPoolDto['reason'];
  costs: StatementCostGroup[];
}

function groupByMachine<T extends { machineId: string }>(rows: readonly T[]): Map<string, T[]> {
  const by = new Map<string, T[]>();
  for (const row of rows) {
    const list = by.get(row.machineId);
    if (list) list.push(row);
    else by.set(row.machineId, [row]);
  }
  return by;
}

function splits(amounts: ReadonlyArray<{ householdId: string; amount: Decimal }>): StatementSplitDto[] {
  return amounts.map((part) => ({ householdId: part.householdId, amount: toMoneyString(part.amount) }));
}

export function buildSquareUpStatementOrThrow(input: StatementInput): StatementFigures {
  const householdIds = input.households.map((h) => h.id);
  const householdSet = new Set(householdIds);
  const names = new Map(input.households.map((h) => [h.id, h.name]));
  const machines = new Map(input.machines.map((m) => [m.id, m]));
  const machineName = (id: string | null) => (id ? (machines.get(id)?.name ?? 'a machine') : 'the period');
  const warnings = new Warnings();
  const sets = usableShareSets(input, new Map(householdIds.map((id, index) => [id, index])), warnings);
  const tallies = new Map(householdIds.map((id) => [id, { paid: new Dec(0), share: new Dec(0), useCharged: new Dec(0), useCredited: new Dec(0) } as Tally]));
  const machineRows: StatementMachineDto[] = [];
  const useCharges: StatementUseChargeDto[] = [];

  const usesBy = groupByMachine(input.uses);
  const costsBy = groupByMachine(input.costs);
  const involved = new Set([...costsBy.keys(), ...usesBy.keys()]);
  const ordered = [...involved].sort((a, b) => machineName(a).localeCompare(machineName(b)) || a.localeCompare(b));

  for (const machineId of ordered) {
    const ownerHours = new Map<string, Decimal>();
    let otherHours = new Dec(0);
    const chargeable: Array<StatementUseGroup & { owners: OwnershipShare[] }> = [];
    for (const use of usesBy.get(machineId) ?? []) {
      const hours = parseDecimalOrThrow(use.hours, 'hours');
      const owners = use.shareSetFrom === null ? undefined : sets.get(shareKey(machineId, use.shareSetFrom));
      if (owners === undefined) {
        warnings.add('use-without-owners', machineId, '', { hours, entries: use.entries });
      } else if (owners === null) {
        continue;
      } else if (owners.some((owner) => owner.householdId === use.householdId)) {
        ownerHours.set(use.householdId, (ownerHours.get(use.householdId) ?? new Dec(0)).plus(hours));
      } else {
        otherHours = otherHours.plus(hours);
        chargeable.push({ ...use, owners });
      }
    }

    // Weights in the households' order, so the same figures always split the same way.
    const useWeights = householdIds.filter((id) => ownerHours.get(id)?.gt(0)).map((id) => ({ householdId: id, use: ownerHours.get(id)! }));
    const pools = new Map<string, PoolDraft>();
    let fixedCosts = new Dec(0);
    let operatingCosts = new Dec(0);
    for (const cost of costsBy.get(machineId) ?? []) {
      const amount = parseDecimalOrThrow(cost.amount, 'amount');
      if (cost.paidByPartyId === null || !householdSet.has(cost.paidByPartyId)) {
        warnings.add('cost-without-payer', machineId, '', { amount, entries: cost.entries });
        continue;
      }
      const owners = cost.shareSetFrom === null ? undefined : sets.get(shareKey(machineId, cost.shareSetFrom));
      if (owners === undefined) {
        warnings.add('cost-without-owners', machineId, '', { amount, entries: cost.entries });
        continue;
      }
      if (owners === null) continue;
      if (cost.costKind === 'fixed') fixedCosts = fixedCosts.plus(amount);
      else operatingCosts = operatingCosts.plus(amount);

      const byUse = cost.costKind === 'operating' || input.fixedCostsBy === 'use';
      const key = byUse && useWeights.length > 0 ? 'use' : `ownership|${cost.shareSetFrom}`;
      let pool = pools.get(key);
      if (!pool) {
        pool =
          key === 'use'
            ? { basis: { by: 'use', users: useWeights }, shareSetFrom: null, kinds: new Set(), reason: null, costs: [] }
            : { basis: { by: 'ownership', owners }, shareSetFrom: cost.shareSetFrom, kinds: new Set(), reason: null, costs: [] };
        pools.set(key, pool);
      }
      if (byUse && key !== 'use') pool.reason = 'no-owner-use';
      pool.kinds.add(cost.costKind);
      pool.costs.push(cost);
    }

    const poolRows: StatementPoolDto[] = [];
    const poolOrder = [...pools.entries()].sort(([a], [b]) => (a === 'use' ? -1 : b === 'use' ? 1 : a.localeCompare(b)));
    for (const [, pool] of poolOrder) {
      const shared = poolCosts(
        `${machineName(machineId)} costs`,
        pool.costs.map((cost) => ({ label: machineName(machineId), amount: cost.amount, paidBy: { [cost.paidByPartyId!]: cost.amount } })),
        pool.basis,
      );
      const split = splitCostOrThrow(shared.amount, shared.basis);
      const paid = householdIds.filter((id) => shared.paidBy[id] !== undefined).map((id) => ({ householdId: id, amount: parseDecimalOrThrow(shared.paidBy[id]!) }));
      for (const part of paid) tallies.get(part.householdId)!.paid = tallies.get(part.householdId)!.paid.plus(part.amount);
      for (const part of split) tallies.get(part.householdId)!.share = tallies.get(part.householdId)!.share.plus(part.amount);
      poolRows.push({
        basis: pool.basis.by,
        shareSetFrom: pool.shareSetFrom,
        costKinds: (['fixed', 'operating'] as const).filter((kind) => pool.kinds.has(kind)),
        reason: pool.reason,
        amount: toMoneyString(shared.amount),
        paid: splits(paid),
        split: splits(split),
      });
    }

    for (const use of chargeable) {
      const machine = machines.get(machineId);
      const rate = use.ratePerHour ?? machine?.actualRatePerHour ?? null;
      if (rate === null) {
        warnings.add('use-without-rate', machineId, names.get(use.householdId) ?? 'a household', { hours: parseDecimalOrThrow(use.hours), entries: use.entries });
        continue;
      }
      const charge = useChargeAsCostOrThrow({ label: `${machineName(machineId)} use`, usedBy: use.householdId, hours: use.hours, hourlyRate: rate, owners: use.owners });
      const amount = parseDecimalOrThrow(charge.amount);
      const credits = use.owners.map((owner) => ({ householdId: owner.householdId, amount: parseDecimalOrThrow(charge.paidBy[owner.householdId] ?? 0) }));
      tallies.get(use.householdId)!.useCharged = tallies.get(use.householdId)!.useCharged.plus(amount);
      for (const credit of credits) tallies.get(credit.householdId)!.useCredited = tallies.get(credit.householdId)!.useCredited.plus(credit.amount);
      useCharges.push({
        machineId,
        machineName: machineName(machineId),
        householdId: use.householdId,
        hours: hoursString(parseDecimalOrThrow(use.hours)),
        ratePerHour: rateString(parseDecimalOrThrow(rate)),
        rateSource: use.ratePerHour !== null ? 'rate-sheet' : 'actual-rate',
        rateSheetId: use.ratePerHour !== null ? use.rateSheetId : null,
        shareSetFrom: use.shareSetFrom!,
        amount: toMoneyString(amount),
        credits: splits(credits),
      });
    }

    machineRows.push({
      machineId,
      name: machineName(machineId),
      fixedCosts: toMoneyString(fixedCosts),
      operatingCosts: toMoneyString(operatingCosts),
      ownerHours: useWeights.map((w) => ({ householdId: w.householdId, hours: hoursString(w.use) })),
      otherHours: hoursString(otherHours),
      pools: poolRows,
    });
  }

  // Each pool's payments and split, and each use charge's credits and charge, add up to that cost, so the
  // tallies' balances sum to zero to the cent: the same balances the cost-sharing engine gives those costs.
  const balances = new Map(householdIds.map((id) => {
    const tally = tallies.get(id)!;
    return [id, tally.paid.minus(tally.share).plus(tally.useCredited).minus(tally.useCharged)];
  }));
  const settled = { transfers: settleBalancesOrThrow(householdIds.map((id) => ({ householdId: id, balance: balances.get(id)! }))) };
  const households = input.households
    .map((h) => ({ h, tally: tallies.get(h.id)!, balance: balances.get(h.id)! }))
    .filter(({ h, tally, balance }) => !h.archived || !(tally.paid.isZero() && tally.share.isZero() && tally.useCharged.isZero() && tally.useCredited.isZero() && balance.isZero()))
    .map(({ h, tally, balance }) => ({
      householdId: h.id,
      name: h.name,
      paid: toMoneyString(tally.paid),
      share: toMoneyString(tally.share),
      useCharged: toMoneyString(tally.useCharged),
      useCredited: toMoneyString(tally.useCredited),
      balance: toMoneyString(balance),
    }));

  const sum = (values: Decimal[]) => values.reduce((total, value) => total.plus(value), new Dec(0));
  return {
    households,
    machines: machineRows,
    useCharges,
    transfers: settled.transfers.map((transfer, index) => ({
      id: null,
      position: index + 1,
      fromHouseholdId: transfer.from,
      fromName: names.get(transfer.from)!,
      toHouseholdId: transfer.to,
      toName: names.get(transfer.to)!,
      amount: toMoneyString(transfer.amount),
      paidOn: null,
      method: null,
      reference: null,
    })),
    totals: {
      costs: toMoneyString(sum(machineRows.flatMap((m) => m.pools.map((p) => new Dec(p.amount))))),
      useCharges: toMoneyString(sum(useCharges.map((u) => new Dec(u.amount)))),
      positiveBalances: toMoneyString(sum([...balances.values()].filter((b) => b.gt(0)))),
    },
    warnings: warnings.list(machineName),
  };
}

/** A warning the database side adds: work in the period that is not approved yet. */
export function pendingEntriesWarning(count: number): StatementWarningDto {
  return { code: 'entries-pending', machineId: null, message: warningMessage({ code: 'entries-pending', entries: count, amount: new Dec(0), hours: new Dec(0), about: '' }, '') };
}

/** Use that no family sheet prices needs the machines' actual rates; most periods need none. */
export function needsActualRates(sums: StatementSums): boolean {
  return sums.uses.some((use) => use.ratePerHour === null);
}

/** The whole statement of a period from its sums and, where needed, the machines' actual rates for the year. */
export function squareUpStatementOrThrow(
  squareUp: SquareUpDto,
  sums: StatementSums,
  actualRates: ReadonlyMap<string, ActualRate>,
  computedAt: string,
): SquareUpStatementDto {
  const figures = buildSquareUpStatementOrThrow({
    fixedCostsBy: squareUp.fixedCostsBy,
    households: sums.households,
    machines: sums.machines.map((m) => {
      const perHour = actualRates.get(m.id)?.perHour;
      return { id: m.id, name: m.name, actualRatePerHour: perHour ? fixed(perHour.total, 4) : null };
    }),
    shareSets: sums.shareSets,
    costs: sums.costs,
    uses: sums.uses,
  });
  return {
    squareUp,
    frozen: false,
    computedAt,
    ...figures,
    pendingEntries: sums.pendingEntries,
    warnings: sums.pendingEntries > 0 ? [pendingEntriesWarning(sums.pendingEntries), ...figures.warnings] : figures.warnings,
    rules: squareUpRules(squareUp.fixedCostsBy),
  };
}
