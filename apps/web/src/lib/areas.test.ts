import { describe, expect, it } from 'vitest';
import { ROLES } from '@hitchbook/shared/roles';
import { accessTo, areasFor } from './areas';

const labelsFor = (role: (typeof ROLES)[number]) => areasFor(role).map((a) => a.label);

describe('role areas', () => {
  it('gives the owner every area, in navigation order', () => {
    expect(labelsFor('owner')).toEqual(['Dashboard', 'Estimates', 'Parties', 'Users', 'Account']);
  });

  it('gives a partner estimates and parties but not users', () => {
    expect(labelsFor('partner')).toEqual(['Dashboard', 'Estimates', 'Parties', 'Account']);
  });

  it('keeps money areas away from operators and customers', () => {
    expect(labelsFor('operator')).toEqual(['Dashboard', 'Account']);
    expect(labelsFor('customer')).toEqual(['Dashboard', 'Account']);
  });

  it('lets the bookkeeper view parties and users without managing them', () => {
    expect(labelsFor('bookkeeper')).toEqual(['Dashboard', 'Estimates', 'Parties', 'Users', 'Account']);
    expect(accessTo('bookkeeper', 'parties')).toBe('view');
    expect(accessTo('bookkeeper', 'users')).toBe('view');
    expect(accessTo('owner', 'users')).toBe('manage');
  });

  it('answers null for an area the role may not open', () => {
    expect(accessTo('operator', 'estimates')).toBeNull();
    expect(accessTo('partner', 'users')).toBeNull();
  });

  it('gives every role the dashboard and its own account', () => {
    for (const role of ROLES) {
      expect(accessTo(role, 'dashboard')).not.toBeNull();
      expect(accessTo(role, 'account')).not.toBeNull();
    }
  });
});
