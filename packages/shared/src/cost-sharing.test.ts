import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { Decimal } from 'decimal.js';
import {
  householdBalancesOrThrow,
  poolCosts,
  splitByOwnershipOrThrow,
  splitByUseOrThrow,
  useChargeAsCostOrThrow,
  type SharedCost,
} from './cost-sharing.js';
import { squareUpOrThrow } from './settlement.js';

function byHousehold(rows: readonly { householdId: string; amount: Decimal }[]): Record<string, string> {
  return Object.fromEntries(rows.map((row) => [row.householdId, row.amount.toFixed(2)]));
}

// Iowa State AgDM A3-34 teaching activity: $150,000 combine bought half each;
// interest 7 %, depreciation 10 %/yr, insurance 0.5 %, housing 0.5 % (Al
// houses it), fuel and lube $1,800, repairs $2,500; Al 1,000 acres, Chris
// 1,200. Contributions are the trade reference's reading of who pays what (§10).
function a334Costs(repairsPaidBy: Record<string, string> = { al: '1250', chris: '1250' }): SharedCost[] {
  const byUse = { by: 'use' as const, users: [{ householdId: 'al', use: 1000 }, { householdId: 'chris', use: 1200 }] };
  return [
    { label: 'Depreciation', amount: '15000', paidBy: { al: '7500', chris: '7500' }, basis: byUse },
    { label: 'Interest', amount: '10500', paidBy: { al: '5250', chris: '5250' }, basis: byUse },
    { label: 'Insurance', amount: '750', paidBy: { al: '375', chris: '375' }, basis: byUse },
    { label: 'Housing', amount: '750', paidBy: { al: '750' }, basis: byUse },
    { label: 'Fuel and lube', amount: '1800', paidBy: { al: '900', chris: '900' }, basis: byUse },
    { label: 'Repairs', amount: '2500', paidBy: repairsPaidBy, basis: byUse },
  ];
}

describe('splitting a machine cost', () => {
  it('gives 2/3 and 1/3 for 1,000 and 500 acres of use (Iowa State AgDM A3-34, Joint Machinery Ownership)', () => {
    const users = [{ householdId: 'al', use: 1000 }, { householdId: 'chris', use: 500 }];
    expect(byHousehold(splitByUseOrThrow('30000', users))).toEqual({ al: '20000.00', chris: '10000.00' });
    // An amount that does not divide by three still adds up: 666.67 + 333.33.
    expect(byHousehold(splitByUseOrThrow('1000', users))).toEqual({ al: '666.67', chris: '333.33' });
  });

  it('splits 50/50 ownership evenly (Iowa State AgDM A3-34)', () => {
    const owners = [{ householdId: 'al', ownershipPct: '50' }, { householdId: 'chris', ownershipPct: '50' }];
    expect(byHousehold(splitByOwnershipOrThrow('31300', owners))).toEqual({ al: '15650.00', chris: '15650.00' });
  });

  it('refuses ownership that does not add up to 100 %', () => {
    const owners = [{ householdId: 'al', ownershipPct: '60' }, { householdId: 'chris', ownershipPct: '30' }];
    expect(() => splitByOwnershipOrThrow('100', owners)).toThrow(/adds up to 90/);
  });
});

describe('householdBalancesOrThrow', () => {
  it('has Chris owe Al $1,797.73 on the A3-34 combine (A3-34 teaching activity inputs; computed, trade reference §10 [C-calc])', () => {
    const result = squareUpOrThrow(['al', 'chris'], [poolCosts('Combine', a334Costs(), a334Costs()[0]!.basis)]);
    expect(result.totalCost.toString()).toBe('31300');
    const rows = Object.fromEntries(result.households.map((row) => [row.householdId, row]));
    expect(rows.al?.share.toFixed(2)).toBe('14227.27');
    expect(rows.chris?.share.toFixed(2)).toBe('17072.73');
    expect(rows.al?.paid.toFixed(2)).toBe('16025.00');
    expect(rows.chris?.paid.toFixed(2)).toBe('15275.00');
    expect(result.transfers.map((t) => [t.from, t.to, t.amount.toFixed(2)])).toEqual([['chris', 'al', '1797.73']]);
  });

  it('has Chris owe Al $547.73 once Chris pays all repairs (A3-34 teaching activity; computed, trade reference §10 [C-calc])', () => {
    const costs = a334Costs({ chris: '2500' });
    const result = squareUpOrThrow(['al', 'chris'], [poolCosts('Combine', costs, costs[0]!.basis)]);
    expect(result.transfers.map((t) => [t.from, t.to, t.amount.toFixed(2)])).toEqual([['chris', 'al', '547.73']]);
  });

  it('refuses payments that do not add up to the cost, or from an unknown household', () => {
    const basis = { by: 'use' as const, users: [{ householdId: 'al', use: 1 }] };
    expect(() =>
      householdBalancesOrThrow(['al'], [{ label: 'Tires', amount: '900', paidBy: { al: '899.99' }, basis }]),
    ).toThrow(/Tires: payments add up to 899.99, not 900.00/);
    expect(() =>
      householdBalancesOrThrow(['al'], [{ label: 'Tires', amount: '900', paidBy: { bo: '900' }, basis }]),
    ).toThrow(/"bo" is not one of the households/);
    expect(() => householdBalancesOrThrow(['al', 'al'], [])).toThrow(/only once/);
  });

  it('keeps balances summing to zero to the cent whatever the costs', () => {
    const households = ['a', 'b', 'c', 'd'];
    const cents = fc.integer({ min: 0, max: 10_000_000 });
    const costArb = fc.record({
      amountCents: cents,
      payerShares: fc.array(fc.integer({ min: 0, max: 10 }), { minLength: 4, maxLength: 4 }),
      weights: fc.array(fc.integer({ min: 0, max: 2000 }), { minLength: 4, maxLength: 4 }),
      byOwnership: fc.boolean(),
    });
    fc.assert(
      fc.property(fc.array(costArb, { minLength: 1, maxLength: 6 }), (drafts) => {
        const costs: SharedCost[] = drafts.map((draft, index) => {
          const amount = new Decimal(draft.amountCents).div(100);
          const payerWeights = draft.payerShares.some((w) => w > 0) ? draft.payerShares : [1, 0, 0, 0];
          const paid = splitByUseOrThrow(amount, households.map((householdId, i) => ({ householdId, use: payerWeights[i]! })));
          const weights = draft.weights.some((w) => w > 0) ? draft.weights : [0, 0, 0, 1];
          return {
            label: `cost ${index}`,
            amount,
            paidBy: Object.fromEntries(paid.map((row) => [row.householdId, row.amount])),
            basis: draft.byOwnership
              ? { by: 'ownership', owners: [{ householdId: 'a', ownershipPct: '33.34' }, { householdId: 'b', ownershipPct: '33.33' }, { householdId: 'c', ownershipPct: '33.33' }] }
              : { by: 'use', users: households.map((householdId, i) => ({ householdId, use: weights[i]! })) },
          };
        });
        const result = householdBalancesOrThrow(households, costs);
        const net = result.households.reduce((sum, row) => sum.plus(row.balance), new Decimal(0));
        expect(net.isZero()).toBe(true);
        const shares = result.households.reduce((sum, row) => sum.plus(row.share), new Decimal(0));
        expect(shares.eq(result.totalCost)).toBe(true);
        for (const row of result.households) expect(row.balance.times(100).isInteger()).toBe(true);
      }),
    );
  });
});

describe('useChargeAsCostOrThrow', () => {
  it("charges a household's hours on another's tractor at the machine's hourly rate", () => {
    // 12.5 h × $86.97 (the A3-29 tractor's rate, trade reference §6a) = 1,087.125 → 1,087.13.
    const charge = useChargeAsCostOrThrow({
      label: 'Tractor hours',
      usedBy: 'bo',
      hours: '12.5',
      hourlyRate: '86.97',
      owners: [{ householdId: 'al', ownershipPct: '100' }],
    });
    const result = squareUpOrThrow(['al', 'bo'], [charge]);
    expect(result.transfers.map((t) => [t.from, t.to, t.amount.toFixed(2)])).toEqual([['bo', 'al', '1087.13']]);
  });

  it('has a part-owner pay the co-owner only for the part they do not own', () => {
    // 1,087.13 split 50/50 by ownership: 543.57 (earlier owner takes the odd cent) and 543.56.
    const charge = useChargeAsCostOrThrow({
      label: 'Tractor hours',
      usedBy: 'bo',
      hours: '12.5',
      hourlyRate: '86.97',
      owners: [{ householdId: 'al', ownershipPct: '50' }, { householdId: 'bo', ownershipPct: '50' }],
    });
    const result = squareUpOrThrow(['al', 'bo'], [charge]);
    expect(result.transfers.map((t) => [t.from, t.to, t.amount.toFixed(2)])).toEqual([['bo', 'al', '543.57']]);
  });
});
