import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Page } from '@hitchbook/shared/schemas/common';
import { api } from '../../../lib/api';

export interface PartyOption {
  id: string;
  name: string;
}

/** The households or customers a sign-in can be tied to, for the pickers on this page. */
export function listPartyOptions(kind: 'household' | 'customer', signal?: AbortSignal) {
  return api.get<Page<PartyOption>>('/api/parties', { query: { kind, pageSize: 200, sort: 'name' }, signal });
}

// Filed under 'parties' so that adding or renaming a party refreshes these pickers too.
export function partyOptionsQueryOptions(kind: 'household' | 'customer') {
  return queryOptions({
    queryKey: ['parties', 'options', kind],
    queryFn: ({ signal }) => listPartyOptions(kind, signal),
    select: (page) => page.items.map((p) => ({ value: p.id, label: p.name })),
  });
}

export function usePartyOptions(kind: 'household' | 'customer', enabled: boolean) {
  return useQuery({ ...partyOptionsQueryOptions(kind), enabled });
}
