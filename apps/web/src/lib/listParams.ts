import { useCallback } from 'react';
import { useSearchParams } from 'react-router-dom';

/** Paging, sorting and search of a server-side list, kept in the URL so a view can be shared. */
export interface ListParams {
  page: number;
  pageSize: number;
  sort: string | undefined;
  q: string | undefined;
}

export const PAGE_SIZES = [10, 25, 50, 100] as const;

export interface ListDefaults {
  pageSize?: number;
  sort?: string;
}

function positiveInt(raw: string | null, fallback: number): number {
  const n = Number(raw);
  return Number.isInteger(n) && n > 0 ? n : fallback;
}

export function readListParams(search: URLSearchParams, defaults: ListDefaults = {}): ListParams {
  const pageSize = positiveInt(search.get('pageSize'), defaults.pageSize ?? 25);
  return {
    page: positiveInt(search.get('page'), 1),
    pageSize: (PAGE_SIZES as readonly number[]).includes(pageSize) ? pageSize : (defaults.pageSize ?? 25),
    sort: search.get('sort') || defaults.sort,
    q: search.get('q') || undefined,
  };
}

/** The server's sort parameter is a column name, with a leading "-" for descending. */
export function sortingFromParam(sort: string | undefined): { id: string; desc: boolean }[] {
  if (!sort) return [];
  return sort.startsWith('-') ? [{ id: sort.slice(1), desc: true }] : [{ id: sort, desc: false }];
}

export function sortParamFrom(sorting: readonly { id: string; desc: boolean }[]): string | undefined {
  const first = sorting[0];
  if (!first) return undefined;
  return first.desc ? `-${first.id}` : first.id;
}

/**
 * Applies a change to the URL's search params. Changing anything other than the page itself
 * goes back to page 1, because the old page number means nothing in a new result set.
 */
export function applyListPatch(
  search: URLSearchParams,
  patch: Record<string, string | number | undefined>,
): URLSearchParams {
  const next = new URLSearchParams(search);
  for (const [key, value] of Object.entries(patch)) {
    if (value === undefined || value === '') next.delete(key);
    else next.set(key, String(value));
  }
  if (!('page' in patch)) next.delete('page');
  if (next.get('page') === '1') next.delete('page');
  return next;
}

export function useListParams(defaults: ListDefaults = {}) {
  const [searchParams, setSearchParams] = useSearchParams();
  const params = readListParams(searchParams, defaults);
  const update = useCallback(
    (patch: Record<string, string | number | undefined>) =>
      setSearchParams((prev) => applyListPatch(prev, patch), { replace: true }),
    [setSearchParams],
  );
  return { params, searchParams, update };
}
