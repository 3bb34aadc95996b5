import { describe, expect, it } from 'vitest';
import { applySectionPatch, sectionSearch } from './sectionParams';

describe('section params', () => {
  it('reads only the section’s own keys, without their prefix', () => {
    const own = sectionSearch(new URLSearchParams('costPage=2&costCategory=fuel&entriesPage=3&year=2025'), 'cost');
    expect(Object.fromEntries(own)).toEqual({ page: '2', category: 'fuel' });
  });

  it('sends a filter change back to the section’s first page and leaves the other table alone', () => {
    const next = applySectionPatch(new URLSearchParams('costPage=4&entriesPage=3&year=2025'), 'cost', { category: 'repair' });
    expect(Object.fromEntries(next)).toEqual({ entriesPage: '3', year: '2025', costCategory: 'repair' });
  });

  it('keeps the page it was asked to go to', () => {
    const next = applySectionPatch(new URLSearchParams('costCategory=fuel'), 'cost', { page: 2 });
    expect(next.get('costPage')).toBe('2');
    expect(next.get('costCategory')).toBe('fuel');
  });

  it('removes a cleared filter', () => {
    const next = applySectionPatch(new URLSearchParams('costCategory=fuel&costFrom=2025-01-01'), 'cost', { category: undefined });
    expect(Object.fromEntries(next)).toEqual({ costFrom: '2025-01-01' });
  });
});
