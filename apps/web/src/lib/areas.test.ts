import { describe, expect, it } from 'vitest';
import { ROLES } from '@hitchbook/shared/roles';
import { accessTo, areasFor } from './areas';

const labelsFor = (role: (typeof ROLES)[number]) => areasFor(role).map((a) => a.label);

describe('role areas', () => {
  it('gives the owner every area, in navigation order', () => {
    expect(labelsFor('owner')).toEqual(['Dashboard', 'Work', 'Machines', 'Fields', 'Square-up', 'Year-end', 'Invoices', 'Rates', 'Estimates', 'Parties', 'Users', 'Audit log', 'Account']);
  });

  it('gives a partner estimates and parties but not users', () => {
    expect(labelsFor('partner')).toEqual(['Dashboard', 'Work', 'Machines', 'Fields', 'Square-up', 'Year-end', 'Invoices', 'Rates', 'Estimates', 'Parties', 'Account']);
  });

  it('keeps money areas away from operators and customers', () => {
    expect(labelsFor('operator')).toEqual(['Dashboard', 'Work', 'Machines', 'Fields', 'Account']);
    expect(labelsFor('customer')).toEqual(['Dashboard', 'My invoices', 'Account']);
  });

  it('lets the bookkeeper view parties and users without managing them', () => {
    expect(labelsFor('bookkeeper')).toEqual(['Dashboard', 'Work', 'Machines', 'Fields', 'Square-up', 'Year-end', 'Invoices', 'Rates', 'Estimates', 'Parties', 'Users', 'Audit log', 'Account']);
    expect(accessTo('bookkeeper', 'parties')).toBe('view');
    expect(accessTo('bookkeeper', 'users')).toBe('view');
    expect(accessTo('owner', 'users')).toBe('manage');
  });

  it('lets an operator log work but only look at machines and fields', () => {
    expect(accessTo('operator', 'work')).toBe('manage');
    expect(accessTo('operator', 'machines')).toBe('view');
    expect(accessTo('operator', 'fields')).toBe('view');
    expect(accessTo('bookkeeper', 'work')).toBe('view');
  });

  it('keeps customers out of work, machines and fields', () => {
    expect(accessTo('customer', 'work')).toBeNull();
    expect(accessTo('customer', 'machines')).toBeNull();
    expect(accessTo('customer', 'fields')).toBeNull();
  });

  it('lets owner and partner run square-ups, the bookkeeper only read them', () => {
    expect(accessTo('owner', 'squareUps')).toBe('manage');
    expect(accessTo('partner', 'squareUps')).toBe('manage');
    expect(accessTo('bookkeeper', 'squareUps')).toBe('view');
    expect(accessTo('operator', 'squareUps')).toBeNull();
    expect(accessTo('customer', 'squareUps')).toBeNull();
  });

  it('shows year-end rates to the money roles and lets only the owner accept them', () => {
    expect(accessTo('owner', 'yearEnd')).toBe('manage');
    expect(accessTo('partner', 'yearEnd')).toBe('view');
    expect(accessTo('bookkeeper', 'yearEnd')).toBe('view');
    expect(accessTo('operator', 'yearEnd')).toBeNull();
    expect(accessTo('customer', 'yearEnd')).toBeNull();
  });

  it('lets the owner bill and set rates, the partner and the bookkeeper read both', () => {
    expect(accessTo('owner', 'invoices')).toBe('manage');
    expect(accessTo('owner', 'rates')).toBe('manage');
    expect(accessTo('partner', 'invoices')).toBe('view');
    expect(accessTo('partner', 'rates')).toBe('view');
    expect(accessTo('bookkeeper', 'invoices')).toBe('view');
    expect(accessTo('bookkeeper', 'rates')).toBe('view');
  });

  it('gives a customer their own invoices and nothing of the billing behind them', () => {
    expect(accessTo('customer', 'myInvoices')).toBe('manage');
    expect(accessTo('customer', 'invoices')).toBeNull();
    expect(accessTo('customer', 'rates')).toBeNull();
    expect(accessTo('operator', 'invoices')).toBeNull();
    expect(accessTo('owner', 'myInvoices')).toBeNull();
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
