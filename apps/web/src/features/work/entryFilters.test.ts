import { describe, expect, it } from 'vitest';
import { hasFilters, readEntryFilters } from './entryFilters';

const field = '0b6f1c2e-5d1a-4c5e-9a55-2f0d9a3b1c02';

describe('work entry filters in the URL', () => {
  it('reads the dates, ids and several states', () => {
    const filters = readEntryFilters(new URLSearchParams(`dateFrom=2025-06-02&dateTo=2025-06-08&fieldId=${field}&state=submitted,approved&sort=-hours`));
    expect(filters).toMatchObject({ dateFrom: '2025-06-02', dateTo: '2025-06-08', fieldId: field, states: ['submitted', 'approved'], sort: '-hours' });
  });

  it('drops what the server would refuse instead of sending it', () => {
    const filters = readEntryFilters(new URLSearchParams('dateFrom=June&fieldId=42&state=lost,draft,draft&sort=price'));
    expect(filters.dateFrom).toBeUndefined();
    expect(filters.fieldId).toBeUndefined();
    expect(filters.states).toEqual(['draft']);
    expect(filters.sort).toBe('-date');
  });

  it('tells a filtered view from the whole table, whatever the sort', () => {
    expect(hasFilters(readEntryFilters(new URLSearchParams('sort=hours')))).toBe(false);
    expect(hasFilters(readEntryFilters(new URLSearchParams('state=draft')))).toBe(true);
  });
});
