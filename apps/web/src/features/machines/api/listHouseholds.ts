import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Page } from '@hitchbook/shared/schemas/common';
import { api } from '../../../lib/api';

export interface Household {
  id: string;
  name: string;
}

const HOUSEHOLDS = { kind: 'household', pageSize: 200, sort: 'name' } as const;

/** The households of the outfit: who can own a share of a machine and who pays its costs. */
export function listHouseholds(signal?: AbortSignal) {
  return api.get<Page<Household>>('/api/parties', { query: HOUSEHOLDS, signal });
}

export function householdsQueryOptions() {
  return queryOptions({ queryKey: ['parties', 'list', HOUSEHOLDS], queryFn: ({ signal }) => listHouseholds(signal), select: (page) => page.items });
}

export function useHouseholds(enabled = true) {
  return useQuery({ ...householdsQueryOptions(), enabled });
}
