import { describe, expect, it } from 'vitest';
import {
  initialJointOwnership,
  jointOwnershipIssuePath,
  sumOfTyped,
  toJointOwnershipRequest,
  type JointOwnershipValues,
} from './jointOwnershipForm';

function twoHouseholds(): JointOwnershipValues {
  return {
    members: [
      { key: 'a', name: ' Home place ', ownershipPct: '50', use: '1000' },
      { key: 'b', name: 'North place', ownershipPct: '50', use: '500' },
    ],
    costs: [{ key: 'x', label: 'Depreciation', amount: '15000', paid: ['7500', ''] }],
    settleBy: 'use',
  };
}

describe('joint ownership request', () => {
  it('names members by their trimmed names and keys payments by those names', () => {
    expect(toJointOwnershipRequest(twoHouseholds())).toEqual({
      members: [
        { id: 'Home place', ownershipPct: '50', use: '1000' },
        { id: 'North place', ownershipPct: '50', use: '500' },
      ],
      costs: [{ label: 'Depreciation', amount: '15000', paidBy: { 'Home place': '7500', 'North place': '0' } }],
      settleBy: 'use',
    });
  });

  it('starts with two households and a payment slot for each on every cost', () => {
    const values = initialJointOwnership();
    expect(values.members).toHaveLength(2);
    expect(values.costs.every((c) => c.paid.length === 2)).toBe(true);
  });
});

describe('joint ownership issue paths', () => {
  it('puts a payment issue on the payment field of that member', () => {
    expect(jointOwnershipIssuePath('costs.0.paidBy.North place', twoHouseholds())).toBe('costs.0.paid.1');
  });

  it('puts a rule about all payments of a cost under its amount', () => {
    expect(jointOwnershipIssuePath('costs.0.paidBy', twoHouseholds())).toBe('costs.0.amount');
  });

  it('puts a member id issue on the name field and leaves other paths alone', () => {
    expect(jointOwnershipIssuePath('members.1.id', twoHouseholds())).toBe('members.1.name');
    expect(jointOwnershipIssuePath('members.0.ownershipPct', twoHouseholds())).toBe('members.0.ownershipPct');
  });
});

describe('running sums', () => {
  it('adds what is typed and skips half-typed fields, exactly', () => {
    expect(sumOfTyped(['33.3', '33.3', '33.4']).toString()).toBe('100');
    expect(sumOfTyped(['50', '', 'abc']).toString()).toBe('50');
    expect(sumOfTyped(['0.1', '0.2']).toString()).toBe('0.3');
  });
});
