import { describe, expect, it } from 'vitest';
import type { z } from 'zod';
import {
  breakEvenRequestSchema,
  fieldCapacityRequestSchema,
  jointOwnershipRequestSchema,
  machineCostRequestSchema,
} from './estimates.js';

function issuesOf(schema: z.ZodType, input: unknown): { path: string; message: string }[] {
  const result = schema.safeParse(input);
  if (result.success) return [];
  return result.error.issues.map((issue) => ({ path: issue.path.join('.'), message: issue.message }));
}

function pathsOf(schema: z.ZodType, input: unknown): string[] {
  return issuesOf(schema, input).map((issue) => issue.path);
}

// The request of the API contract's example (design/api.md, machine-cost).
function tractorRequest(): Record<string, unknown> {
  return {
    machineClass: 'tractor-2wd',
    listPrice: '150000',
    purchasePrice: '130000',
    yearsOwned: 15,
    hoursPerYear: 400,
    interestRatePct: '8',
    ptoHp: 180,
    fuelType: 'diesel',
    fuelPricePerGallon: '3.00',
    method: 'capital-recovery',
  };
}

describe('machineCostRequestSchema', () => {
  it('accepts the contract example and fills the documented defaults', () => {
    const parsed = machineCostRequestSchema.parse(tractorRequest());
    expect(parsed.listPrice.toString()).toBe('150000');
    expect(parsed.tihPct.toString()).toBe('1');
    expect(parsed.lubePct.toString()).toBe('15');
    expect(parsed.laborWagePerHour.toString()).toBe('0');
    expect(parsed.laborFactor.toString()).toBe('1.1');
    expect(parsed.ageAtPurchase).toBe(0);
    expect(parsed.hoursAtPurchase.toString()).toBe('0');
    expect(parsed.salvageValue).toBeNull();
  });

  it('takes decimals as JSON numbers or strings alike', () => {
    const parsed = machineCostRequestSchema.parse({ ...tractorRequest(), listPrice: 150000.5, purchasePrice: '130000.25', yearsOwned: '15' });
    expect(parsed.listPrice.toString()).toBe('150000.5');
    expect(parsed.purchasePrice.toString()).toBe('130000.25');
    expect(parsed.yearsOwned).toBe(15);
  });

  it('names an unknown field', () => {
    const issues = machineCostRequestSchema.safeParse({ ...tractorRequest(), horsepower: 180 }).error?.issues ?? [];
    expect(issues).toHaveLength(1);
    expect(issues[0]?.code).toBe('unrecognized_keys');
    expect(issues[0]?.message).toContain('horsepower');
  });

  it.each([
    ['listPrice', 'abc', 'Enter a plain decimal number'],
    ['listPrice', '1e5', 'Enter a plain decimal number'],
    ['listPrice', 0, 'Must be above 0'],
    ['listPrice', '-5', 'Must be above 0'],
    ['listPrice', true, 'Enter a number'],
    ['listPrice', undefined, 'Required'],
    ['yearsOwned', 0, 'Must be at least 1'],
    ['yearsOwned', 2.5, 'Must be a whole number'],
    ['hoursPerYear', 0, 'Must be above 0'],
    ['hoursPerYear', 9000, 'Must be at most 8760'],
    ['interestRatePct', '120', 'Must be at most 100'],
    ['tihPct', -1, 'Must be at least 0'],
    ['lubePct', '101', 'Must be at most 100'],
    ['laborFactor', '0.9', 'Must be at least 1'],
    ['fuelPricePerGallon', '0', 'Must be above 0'],
    ['fuelType', 'kerosene', 'Use one of: diesel, gasoline, lpg'],
    ['method', 'declining-balance', 'Use one of: capital-recovery, straight-line'],
    ['machineClass', 'hay-rake', 'Use one of:'],
  ])('rejects %s = %j at that path', (field, value, message) => {
    const issues = issuesOf(machineCostRequestSchema, { ...tractorRequest(), [field]: value });
    expect(issues).toHaveLength(1);
    expect(issues[0]?.path).toBe(field);
    expect(issues[0]?.message).toContain(message);
  });

  it('refuses a purchase price above list and a salvage value above purchase', () => {
    expect(pathsOf(machineCostRequestSchema, { ...tractorRequest(), purchasePrice: '160000' })).toEqual(['purchasePrice']);
    expect(pathsOf(machineCostRequestSchema, { ...tractorRequest(), salvageValue: '140000' })).toEqual(['salvageValue']);
  });

  it('needs horsepower and a fuel price for machines with an engine', () => {
    const { ptoHp: _hp, fuelPricePerGallon: _price, ...withoutEngine } = tractorRequest();
    expect(pathsOf(machineCostRequestSchema, withoutEngine).sort()).toEqual(['fuelPricePerGallon', 'ptoHp']);
    expect(pathsOf(machineCostRequestSchema, { ...withoutEngine, machineClass: 'combine-sp' }).sort()).toEqual([
      'fuelPricePerGallon',
      'ptoHp',
    ]);
  });

  it('refuses horsepower on an implement but not a leftover fuel price', () => {
    const disk = { ...tractorRequest(), machineClass: 'tandem-disk', listPrice: '60000', purchasePrice: '55000' };
    expect(issuesOf(machineCostRequestSchema, disk)).toEqual([
      { path: 'ptoHp', message: 'An implement has no engine: leave ptoHp out and cost the fuel on the tractor' },
    ]);
    const { ptoHp: _hp, ...diskWithoutHp }: Record<string, unknown> = disk;
    expect(pathsOf(machineCostRequestSchema, diskWithoutHp)).toEqual([]);
  });
});

describe('fieldCapacityRequestSchema', () => {
  it('reads an imperial or a metric pass', () => {
    expect(fieldCapacityRequestSchema.parse({ widthFt: 40, speedMph: 6, efficiencyPct: 70 }).system).toBe('imperial');
    expect(fieldCapacityRequestSchema.parse({ widthM: '12', speedKmh: '8', efficiencyPct: '80' }).system).toBe('metric');
  });

  it.each([
    [{ widthFt: 40, efficiencyPct: 70 }, ['speedMph']],
    [{ efficiencyPct: 70 }, ['widthFt', 'speedMph']],
    [{ widthM: 12, efficiencyPct: 70 }, ['speedKmh']],
    [{ widthFt: 40, speedMph: 6, widthM: 12, efficiencyPct: 70 }, ['widthM']],
    [{ widthFt: 40, speedMph: 6, efficiencyPct: 0 }, ['efficiencyPct']],
    [{ widthFt: 40, speedMph: 6, efficiencyPct: 101 }, ['efficiencyPct']],
    [{ widthFt: -40, speedMph: 6, efficiencyPct: 70 }, ['widthFt']],
    [{ widthFt: 40, speedMph: 6 }, ['efficiencyPct']],
  ])('rejects %j at %j', (input, paths) => {
    expect(pathsOf(fieldCapacityRequestSchema, input)).toEqual(paths);
  });
});

describe('breakEvenRequestSchema', () => {
  it('refuses a custom rate that does not exceed the variable cost, at customRatePerAcre', () => {
    const issues = issuesOf(breakEvenRequestSchema, { annualFixedCost: 1000, customRatePerAcre: '4', variableCostPerAcre: '4.00' });
    expect(issues).toEqual([
      {
        path: 'customRatePerAcre',
        message: 'The custom rate must be above your variable cost per acre; otherwise hiring is always cheaper',
      },
    ]);
  });

  it('refuses a negative variable cost and a zero fixed cost', () => {
    expect(pathsOf(breakEvenRequestSchema, { annualFixedCost: 0, customRatePerAcre: 21, variableCostPerAcre: -1 })).toEqual([
      'annualFixedCost',
      'variableCostPerAcre',
    ]);
  });
});

describe('jointOwnershipRequestSchema', () => {
  function planner(): Record<string, unknown> {
    return {
      members: [
        { id: 'al', ownershipPct: '50', use: '1000' },
        { id: 'chris', ownershipPct: '50', use: '1200' },
      ],
      costs: [
        { label: 'Depreciation', amount: '15000', paidBy: { al: '7500', chris: '7500' } },
        { label: 'Housing', amount: '750', paidBy: { al: '750' } },
      ],
      settleBy: 'use',
    };
  }

  it('accepts a consistent plan', () => {
    expect(pathsOf(jointOwnershipRequestSchema, planner())).toEqual([]);
  });

  it('refuses ownership that does not add up to 100, at members', () => {
    const input = { ...planner(), members: [{ id: 'al', ownershipPct: '60', use: 1 }, { id: 'chris', ownershipPct: '30', use: 1 }] };
    expect(issuesOf(jointOwnershipRequestSchema, input)).toEqual([
      { path: 'members', message: 'Ownership must add up to 100 %; it adds up to 90 %' },
    ]);
  });

  it('refuses payments that do not add up to the cost, at costs.N.paidBy', () => {
    const input = planner();
    (input.costs as { paidBy: Record<string, string> }[])[1]!.paidBy = { al: '700' };
    expect(issuesOf(jointOwnershipRequestSchema, input)).toEqual([
      { path: 'costs.1.paidBy', message: 'Payments add up to 700.00, not the amount 750.00' },
    ]);
  });

  it('refuses a payer who is not a member, at costs.N.paidBy.<id>', () => {
    const input = planner();
    (input.costs as { paidBy: Record<string, string> }[])[1]!.paidBy = { zed: '750' };
    expect(pathsOf(jointOwnershipRequestSchema, input)).toEqual(['costs.1.paidBy.zed']);
  });

  it('refuses duplicate members, missing use when settling by use, fractions of a cent and a lone member', () => {
    const duplicate = { ...planner(), members: [{ id: 'al', ownershipPct: 50, use: 1 }, { id: 'al', ownershipPct: 50, use: 1 }] };
    expect(pathsOf(jointOwnershipRequestSchema, duplicate)).toContain('members.1.id');
    const noUse = { ...planner(), members: [{ id: 'al', ownershipPct: 50 }, { id: 'chris', ownershipPct: 50, use: 2 }] };
    expect(pathsOf(jointOwnershipRequestSchema, noUse)).toEqual(['members.0.use']);
    expect(pathsOf(jointOwnershipRequestSchema, { ...noUse, settleBy: 'ownership' })).toEqual([]);
    const subCent = planner();
    (subCent.costs as { amount: string }[])[0]!.amount = '15000.005';
    expect(issuesOf(jointOwnershipRequestSchema, subCent)).toEqual([
      { path: 'costs.0.amount', message: 'Use whole cents (at most 2 decimal places)' },
    ]);
    expect(pathsOf(jointOwnershipRequestSchema, { ...planner(), members: [{ id: 'al', ownershipPct: 100, use: 1 }] })).toContain(
      'members',
    );
  });

  it('refuses a plan settled by use with no use at all', () => {
    const input = { ...planner(), members: [{ id: 'al', ownershipPct: 50, use: 0 }, { id: 'chris', ownershipPct: 50, use: 0 }] };
    expect(issuesOf(jointOwnershipRequestSchema, input)).toEqual([
      { path: 'members', message: 'Settling by use needs some use recorded' },
    ]);
  });
});
