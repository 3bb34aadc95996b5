import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { Page } from '@hitchbook/shared/schemas/common';
import { api } from '../../../lib/api';
import type { ListParams } from '../../../lib/listParams';

export type PartyKind = 'household' | 'customer';
export type Relationship = 'family' | 'neighbour' | 'agency';

export interface Party {
  id: string;
  kind: PartyKind;
  name: string;
  relationship: Relationship;
  email: string | null;
  phone: string | null;
  address: string | null;
  notes: string | null;
}

export interface PartyFilters extends ListParams {
  kind: PartyKind | undefined;
}

export function listParties(filters: PartyFilters, signal?: AbortSignal) {
  return api.get<Page<Party>>('/api/parties', { query: { ...filters }, signal });
}

export function partiesQueryOptions(filters: PartyFilters) {
  return queryOptions({
    queryKey: ['parties', 'list', filters],
    queryFn: ({ signal }) => listParties(filters, signal),
    // Keep the current page on screen while the next one loads, so the table does not jump.
    placeholderData: keepPreviousData,
  });
}

export function useParties(filters: PartyFilters) {
  return useQuery(partiesQueryOptions(filters));
}
