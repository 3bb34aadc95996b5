import { describe, expect, it } from 'vitest';
import { applyListPatch, readListParams, sortParamFrom, sortingFromParam } from './listParams';

describe('list params in the URL', () => {
  it('reads page, size, sort and search with defaults for what is missing', () => {
    expect(readListParams(new URLSearchParams('page=3&q=ridge'), { sort: 'name' })).toEqual({
      page: 3,
      pageSize: 25,
      sort: 'name',
      q: 'ridge',
    });
  });

  it('falls back to defaults for nonsense and for page sizes the table does not offer', () => {
    expect(readListParams(new URLSearchParams('page=-2&pageSize=7'))).toMatchObject({ page: 1, pageSize: 25 });
  });

  it('goes back to page 1 when the search or a filter changes', () => {
    const next = applyListPatch(new URLSearchParams('page=4&kind=customer'), { q: 'township' });
    expect(next.toString()).toBe('kind=customer&q=township');
  });

  it('keeps the page when only the page changes and drops an empty filter', () => {
    expect(applyListPatch(new URLSearchParams('kind=customer'), { page: 2 }).toString()).toBe('kind=customer&page=2');
    expect(applyListPatch(new URLSearchParams('kind=customer&page=2'), { kind: undefined }).toString()).toBe('');
  });

  it('turns the sort parameter into table sorting and back', () => {
    expect(sortingFromParam('-name')).toEqual([{ id: 'name', desc: true }]);
    expect(sortParamFrom([{ id: 'kind', desc: false }])).toBe('kind');
    expect(sortParamFrom([])).toBeUndefined();
  });
});
