import { describe, expect, it } from 'vitest';
import { buildSquareUpStatementOrThrow, type StatementInput } from './square-up.js';

// Figures here are worked by hand in each test.

function input(overrides: Partial<StatementInput> = {}): StatementInput {
  return {
    fixedCostsBy: 'ownership',
    households: [
      { id: 'a', name: 'A', archived: false },
      { id: 'b', name: 'B', archived: false },
      { id: 'old', name: 'Old', archived: true },
    ],
    machines: [{ id: 'm', name: 'Baler', actualRatePerHour: null }],
    shareSets: [{ machineId: 'm', effectiveFrom: '2025-01-01', shares: [{ partyId: 'b', sharePct: '40' }, { partyId: 'a', sharePct: '60' }] }],
    costs: [],
    uses: [],
    ...overrides,
  };
}

describe('square-up statement from summed figures', () => {
  it('splits operating costs by shares, and says why, when no owner used the machine', () => {
    // 250.00 of repairs paid by B, no use: 60 % to A (150.00), 40 % to B (100.00); A owes B 150.00.
    const s = buildSquareUpStatementOrThrow(input({ costs: [{ machineId: 'm', costKind: 'operating', shareSetFrom: '2025-01-01', paidByPartyId: 'b', amount: '250.00', entries: 1 }] }));
    expect(s.machines[0]!.pools).toEqual([
      { basis: 'ownership', shareSetFrom: '2025-01-01', costKinds: ['operating'], reason: 'no-owner-use', amount: '250.00', paid: [{ householdId: 'b', amount: '250.00' }], split: [{ householdId: 'a', amount: '150.00' }, { householdId: 'b', amount: '100.00' }] },
    ]);
    expect(s.transfers).toEqual([expect.objectContaining({ fromHouseholdId: 'a', toHouseholdId: 'b', amount: '150.00' })]);
  });

  it('leaves out costs it cannot split, with a warning each, and omits archived households with nothing', () => {
    const s = buildSquareUpStatementOrThrow(
      input({
        costs: [
          { machineId: 'm', costKind: 'fixed', shareSetFrom: null, paidByPartyId: 'a', amount: '80.00', entries: 2 },
          { machineId: 'm', costKind: 'fixed', shareSetFrom: '2025-01-01', paidByPartyId: null, amount: '12.50', entries: 1 },
        ],
      }),
    );
    expect(s.warnings.map((w) => [w.code, w.message])).toEqual([
      ['cost-without-owners', '2 entries of costs on Baler (80.00) are dated before the machine had owners and are left out.'],
      ['cost-without-payer', '1 entry of costs on Baler (12.50) has no paying household and is left out; record who paid.'],
    ]);
    expect(s.totals.costs).toBe('0.00');
    expect(s.households.map((h) => h.householdId)).toEqual(['a', 'b']);
  });

  it('refuses to split under shares that do not add up to 100 % and names the set', () => {
    const s = buildSquareUpStatementOrThrow(
      input({
        shareSets: [{ machineId: 'm', effectiveFrom: '2025-03-01', shares: [{ partyId: 'a', sharePct: '60' }] }],
        costs: [{ machineId: 'm', costKind: 'fixed', shareSetFrom: '2025-03-01', paidByPartyId: 'a', amount: '100.00', entries: 1 }],
        uses: [{ machineId: 'm', householdId: 'b', shareSetFrom: '2025-03-01', rateSheetId: null, ratePerHour: '20', hours: '3', entries: 1 }],
      }),
    );
    expect(s.warnings.map((w) => w.code)).toEqual(['share-set-invalid']);
    expect(s.warnings[0]!.message).toContain('from 2025-03-01');
    expect(s.useCharges).toEqual([]);
    expect(s.transfers).toEqual([]);
  });

  it('charges a non-owner at the actual rate when no sheet has one, and warns when neither exists', () => {
    const withRate = buildSquareUpStatementOrThrow(
      input({
        households: [...input().households, { id: 'c', name: 'C', archived: false }],
        machines: [{ id: 'm', name: 'Baler', actualRatePerHour: '12.3456' }],
        uses: [{ machineId: 'm', householdId: 'c', shareSetFrom: '2025-01-01', rateSheetId: null, ratePerHour: null, hours: '2.5', entries: 1 }],
      }),
    );
    // 2.5 h × 12.3456 = 30.864 → 30.86, credited 60/40: 18.52 (18.516) and 12.34 (12.344).
    expect(withRate.useCharges).toEqual([
      expect.objectContaining({ rateSource: 'actual-rate', ratePerHour: '12.3456', amount: '30.86', credits: [{ householdId: 'a', amount: '18.52' }, { householdId: 'b', amount: '12.34' }] }),
    ]);
    const without = buildSquareUpStatementOrThrow(
      input({
        households: [...input().households, { id: 'c', name: 'C', archived: false }],
        uses: [{ machineId: 'm', householdId: 'c', shareSetFrom: '2025-01-01', rateSheetId: null, ratePerHour: null, hours: '2.5', entries: 1 }],
      }),
    );
    expect(without.warnings).toEqual([{ code: 'use-without-rate', machineId: 'm', message: '2.50 h on Baler by C are not charged: no family machine-hour rate and no actual cost per hour for the year.' }]);
  });
});
