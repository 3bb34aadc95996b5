import { describe, expect, it } from 'vitest';
import { cardLink } from './cardLinks';

describe('dashboard card links', () => {
  it('sends the owner from waiting entries to the submitted ones', () => {
    expect(cardLink('entries-waiting', 'owner')).toEqual({ href: '/work?state=submitted', label: 'Review the entries' });
  });

  it('sends money roles from the open balance to the square-up', () => {
    expect(cardLink('square-up-balance', 'partner')?.href).toBe('/square-ups');
    expect(cardLink('square-up-balance', 'bookkeeper')?.href).toBe('/square-ups');
  });

  it('sends staff to the overdue invoices and a customer to their own', () => {
    expect(cardLink('overdue-invoices', 'bookkeeper')?.href).toBe('/invoices?state=overdue');
    expect(cardLink('open-invoices', 'customer')?.href).toBe('/my-invoices');
    expect(cardLink('overdue-invoices', 'customer')).toBeNull();
  });

  it('gives no link into an area the role cannot open', () => {
    // A partner sees how many people have a sign-in, but the users area is the owner's.
    expect(cardLink('members', 'partner')).toBeNull();
    expect(cardLink('members', 'owner')?.href).toBe('/users');
  });

  it('leaves a figure without a known place unlinked', () => {
    expect(cardLink('billed-by', 'customer')).toBeNull();
  });
});
