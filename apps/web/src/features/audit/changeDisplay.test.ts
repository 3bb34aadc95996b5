import { describe, expect, it } from 'vitest';
import { fieldLabel, valueText } from './changeDisplay';

describe('audit change display', () => {
  it('names fields in words', () => {
    expect(fieldLabel('approvedAt')).toBe('Approved at');
    expect(fieldLabel('paidByPartyId')).toBe('Paid by party');
    expect(fieldLabel('travelFlat')).toBe('Travel flat');
    expect(fieldLabel('notes')).toBe('Notes');
  });

  it('shortens ids, shows instants as dates and leaves other values alone', () => {
    expect(valueText('00208a4f-5d77-43ef-b802-04e429e36472')).toBe('#00208a4f');
    expect(valueText('2026-12-02T05:29:27.939Z')).toMatch(/^Dec 2, 2026/);
    expect(valueText('2026-11-30')).toBe('2026-11-30');
    expect(valueText('35.00')).toBe('35.00');
    expect(valueText(null)).toBe('—');
  });
});
