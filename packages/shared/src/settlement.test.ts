import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { Decimal } from 'decimal.js';
import { EXACT_SETTLEMENT_LIMIT, settleBalancesOrThrow, type Balance, type Transfer } from './settlement.js';

function asBalances(cents: readonly number[]): Balance[] {
  return cents.map((value, index) => ({ householdId: `h${index}`, balance: new Decimal(value).div(100) }));
}

function applyTransfers(balances: readonly Balance[], transfers: readonly Transfer[]): Map<string, Decimal> {
  const left = new Map(balances.map((entry) => [entry.householdId, new Decimal(entry.balance)]));
  for (const transfer of transfers) {
    // The payer's debt shrinks, the payee's credit shrinks.
    left.set(transfer.from, left.get(transfer.from)!.plus(transfer.amount));
    left.set(transfer.to, left.get(transfer.to)!.minus(transfer.amount));
  }
  return left;
}

// Independent of the code under test: enumerate every partition of the
// households and keep the one with the most blocks that each sum to zero.
function fewestTransfersByBruteForce(cents: readonly number[]): number {
  const open = cents.filter((value) => value !== 0);
  let mostBlocks = 0;
  const blocks: number[] = [];
  const place = (index: number): void => {
    if (index === open.length) {
      if (blocks.every((sum) => sum === 0)) mostBlocks = Math.max(mostBlocks, blocks.length);
      return;
    }
    for (let block = 0; block < blocks.length; block++) {
      blocks[block]! += open[index]!;
      place(index + 1);
      blocks[block]! -= open[index]!;
    }
    blocks.push(open[index]!);
    place(index + 1);
    blocks.pop();
  };
  place(0);
  return open.length - mostBlocks;
}

// Zero-sum balance lists in cents; a small pool of values makes groups that
// cancel among themselves common, which is where fewest-transfers matters.
function zeroSumCents(maxLength: number, pool: fc.Arbitrary<number>): fc.Arbitrary<number[]> {
  return fc.array(pool, { minLength: 1, maxLength: maxLength - 1 }).map((values) => {
    const sum = values.reduce((total, value) => total + value, 0);
    return [...values, -sum];
  });
}

const smallPool = fc.integer({ min: -6, max: 6 }).map((value) => value * 2500);
const widePool = fc.integer({ min: -5_000_000, max: 5_000_000 });

function expectValidSettlement(cents: readonly number[]): Transfer[] {
  const balances = asBalances(cents);
  const transfers = settleBalancesOrThrow(balances);
  const open = cents.filter((value) => value !== 0).length;
  expect(transfers.length).toBeLessThanOrEqual(Math.max(0, open - 1));
  for (const transfer of transfers) {
    expect(transfer.amount.isPositive() && !transfer.amount.isZero()).toBe(true);
    expect(transfer.amount.times(100).isInteger()).toBe(true);
    expect(transfer.from).not.toBe(transfer.to);
  }
  for (const left of applyTransfers(balances, transfers).values()) expect(left.isZero()).toBe(true);
  return transfers;
}

describe('settleBalancesOrThrow', () => {
  it('has the one who owes pay the one who is owed', () => {
    // Joint combine, Iowa State AgDM A3-34 teaching activity; transfer computed
    // from the bulletin's inputs (trade reference §10 [C-calc]): Chris pays Al $1,797.73.
    const transfers = settleBalancesOrThrow([
      { householdId: 'al', balance: '1797.73' },
      { householdId: 'chris', balance: '-1797.73' },
    ]);
    expect(transfers.map((t) => [t.from, t.to, t.amount.toFixed(2)])).toEqual([['chris', 'al', '1797.73']]);
  });

  it('settles a household whose balance mirrors another directly', () => {
    // Largest-with-largest alone would pay 40 from h2 to h0 and need four payments.
    const transfers = expectValidSettlement([5000, 4000, -4000, -3000, -2000]);
    expect(transfers).toHaveLength(3);
    expect(transfers.map((t) => [t.from, t.to, t.amount.toFixed(2)])).toContainEqual(['h2', 'h1', '40.00']);
  });

  it('finds three-way groups that cancel among themselves', () => {
    // {+30, −10, −20} and {+25, +15, −40}: two payments each, four in all;
    // matching largest with largest across the groups takes five.
    expect(expectValidSettlement([3000, 2500, -1000, 1500, -4000, -2000])).toHaveLength(4);
  });

  it('makes no transfers when everyone is square', () => {
    expect(settleBalancesOrThrow(asBalances([0, 0, 0]))).toEqual([]);
  });

  it('refuses balances that do not sum to zero or are not whole cents', () => {
    expect(() => settleBalancesOrThrow(asBalances([100, -99]))).toThrow(/sum to 0.01/);
    expect(() => settleBalancesOrThrow([{ householdId: 'a', balance: '0.005' }, { householdId: 'b', balance: '-0.005' }])).toThrow(
      /cents/,
    );
  });

  it('settles every balance with positive whole-cent payments, at most n − 1', () => {
    fc.assert(fc.property(zeroSumCents(10, widePool), (cents) => void expectValidSettlement(cents)));
  });

  it('uses the fewest payments possible', () => {
    fc.assert(
      fc.property(zeroSumCents(7, smallPool), (cents) => {
        expect(expectValidSettlement(cents)).toHaveLength(fewestTransfersByBruteForce(cents));
      }),
    );
  });

  it('still settles everyone, pairs first, for more households than the exact search takes', () => {
    fc.assert(
      fc.property(zeroSumCents(EXACT_SETTLEMENT_LIMIT + 8, smallPool), (cents) => {
        fc.pre(cents.filter((value) => value !== 0).length > EXACT_SETTLEMENT_LIMIT);
        void expectValidSettlement(cents);
      }),
    );
    const mirrored = Array.from({ length: EXACT_SETTLEMENT_LIMIT + 2 }, (_, index) =>
      index % 2 === 0 ? (index + 1) * 100 : -index * 100,
    );
    expect(expectValidSettlement(mirrored)).toHaveLength(mirrored.length / 2);
  });
});
