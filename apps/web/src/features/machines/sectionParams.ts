import { useCallback } from 'react';
import { useSearchParams } from 'react-router-dom';
import { applyListPatch, readListParams, type ListDefaults, type ListParams } from '../../lib/listParams';

// The machine page holds two server tables (costs, work entries); each keeps its own page,
// sort and filters in the URL under its own prefix ("costPage", "entriesSort"), so both can be
// bookmarked at once without one table's page number moving the other.

const prefixed = (prefix: string, key: string) => `${prefix}${key.charAt(0).toUpperCase()}${key.slice(1)}`;

/** The section's own params, read as if they were the only ones in the URL. */
export function sectionSearch(search: URLSearchParams, prefix: string): URLSearchParams {
  const own = new URLSearchParams();
  for (const [key, value] of search) {
    if (key.startsWith(prefix) && key.length > prefix.length) own.set(key.charAt(prefix.length).toLowerCase() + key.slice(prefix.length + 1), value);
  }
  return own;
}

/** Applies a change to one section only, with the list recipe's page reset. */
export function applySectionPatch(search: URLSearchParams, prefix: string, patch: Record<string, string | number | undefined>): URLSearchParams {
  const own = applyListPatch(sectionSearch(search, prefix), patch);
  const next = new URLSearchParams();
  for (const [key, value] of search) if (!key.startsWith(prefix)) next.append(key, value);
  for (const [key, value] of own) next.set(prefixed(prefix, key), value);
  return next;
}

export function useSectionParams(prefix: string, defaults: ListDefaults = {}) {
  const [searchParams, setSearchParams] = useSearchParams();
  const own = sectionSearch(searchParams, prefix);
  const params: ListParams = readListParams(own, defaults);
  const update = useCallback(
    (patch: Record<string, string | number | undefined>) => setSearchParams((prev) => applySectionPatch(prev, prefix, patch), { replace: true }),
    [setSearchParams, prefix],
  );
  return { params, own, update };
}
