import { describe, expect, it } from 'vitest';
import type { StatementCostLineDto, StatementHouseholdDto, StatementWorkLineDto } from '@hitchbook/shared/schemas/square-ups';
import { balanceBars, costLineRoles, householdTotals, linesKindFor, workLineRole } from './statement';

// Invented households; balance = paid − share + credited − charged for each.
const households: StatementHouseholdDto[] = [
  { householdId: 'a', name: 'Hill', paid: '1000.10', share: '600.05', useCharged: '0.00', useCredited: '100.00', balance: '500.05' },
  { householdId: 'b', name: 'Creek', paid: '200.00', share: '500.03', useCharged: '100.00', useCredited: '0.00', balance: '-400.03' },
  { householdId: 'c', name: 'Ridge', paid: '0.00', share: '100.02', useCharged: '0.00', useCredited: '0.00', balance: '-100.02' },
];

describe('household totals', () => {
  it('adds each column to the cent and shows the balances squaring to zero', () => {
    expect(householdTotals(households)).toEqual({
      paid: '1200.10',
      share: '1200.10',
      useCharged: '100.00',
      useCredited: '100.00',
      balance: '0.00',
    });
  });

  it('adds decimals exactly where floating point would drift', () => {
    const tenths = Array.from({ length: 3 }, (_, i) => ({ ...households[0]!, householdId: String(i), paid: '0.10' }));
    expect(householdTotals(tenths).paid).toBe('0.30');
  });
});

describe('balance chart', () => {
  it('plots one bar per household, owed above the axis and owing below', () => {
    expect(balanceBars(households)).toEqual([
      { name: 'Hill', balance: 500.05 },
      { name: 'Creek', balance: -400.03 },
      { name: 'Ridge', balance: -100.02 },
    ]);
  });
});

describe('drill-down', () => {
  it('explains paid and share with costs, use with work entries', () => {
    expect(linesKindFor('paid')).toBe('cost');
    expect(linesKindFor('share')).toBe('cost');
    expect(linesKindFor('balance')).toBe('cost');
    expect(linesKindFor('useCharged')).toBe('work');
    expect(linesKindFor('useCredited')).toBe('work');
  });

  const cost = (paidByHousehold: boolean, bearsShare: boolean) => ({ paidByHousehold, bearsShare }) as StatementCostLineDto;
  it('marks a cost the household paid, bears a part of, or both', () => {
    expect(costLineRoles(cost(true, true))).toEqual(['paid', 'share']);
    expect(costLineRoles(cost(true, false))).toEqual(['paid']);
    expect(costLineRoles(cost(false, true))).toEqual(['share']);
  });

  const work = (householdId: string, userOwned: boolean) => ({ householdId, userOwned }) as StatementWorkLineDto;
  it('charges use of a machine the household did not own and credits others’ use of its machines', () => {
    expect(workLineRole(work('a', false), 'a')).toBe('charged');
    expect(workLineRole(work('a', true), 'a')).toBe('own-use');
    expect(workLineRole(work('b', false), 'a')).toBe('credited');
  });
});
