import { describe, expect, it } from 'vitest';
import { summariseChange } from './audit-changes.js';

describe('audit change summaries', () => {
  it('lists only the fields that changed, with both values', () => {
    const before = { id: 'e1', version: 3, hours: '2.00', acres: '10.000', state: 'submitted', updatedAt: '2025-05-01T10:00:00Z' };
    const after = { id: 'e1', version: 4, hours: '2.50', acres: '10.000', state: 'approved', updatedAt: '2025-05-01T11:00:00Z' };
    expect(summariseChange(before, after)).toEqual([
      { field: 'hours', before: '2.00', after: '2.50' },
      { field: 'state', before: 'submitted', after: 'approved' },
    ]);
  });

  it('shows what a creation set and what a removal took away', () => {
    expect(summariseChange(null, { name: 'North 40', acres: '40.000', notes: null })).toEqual([
      { field: 'name', before: null, after: 'North 40' },
      { field: 'acres', before: null, after: '40.000' },
    ]);
    expect(summariseChange({ role: 'partner' }, undefined)).toEqual([{ field: 'role', before: 'partner', after: null }]);
  });

  it('never shows secrets and shortens long or nested values', () => {
    const changes = summariseChange({}, { passwordHash: '$2b$12$abc', resetToken: 'x', notes: 'n'.repeat(200), shares: [{ partyId: 'a', sharePct: '50' }] });
    expect(changes.map((c) => c.field)).toEqual(['notes', 'shares']);
    expect(changes[0]!.after).toHaveLength(80);
    expect(changes[0]!.after!.endsWith('…')).toBe(true);
    expect(changes[1]!.after).toBe('[{"partyId":"a","sharePct":"50"}]');
  });

  it('treats a bare value as one field', () => {
    expect(summariseChange('draft', 'issued')).toEqual([{ field: 'value', before: 'draft', after: 'issued' }]);
  });
});
