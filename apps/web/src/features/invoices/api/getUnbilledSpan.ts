import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Page } from '@hitchbook/shared/schemas/common';
import { api } from '../../../lib/api';

export interface UnbilledSpan {
  count: number;
  first: string | null;
  last: string | null;
}

type EntryDate = { workDate: string };

function oneEntry(partyId: string, sort: 'date' | '-date', signal?: AbortSignal) {
  return api.get<Page<EntryDate>>('/api/work-entries', { query: { billToPartyId: partyId, state: 'approved', sort, pageSize: 1 }, signal });
}

/** How many approved entries wait to be billed to the party, and the first and last day of them. */
export async function getUnbilledSpan(partyId: string, signal?: AbortSignal): Promise<UnbilledSpan> {
  const [earliest, latest] = await Promise.all([oneEntry(partyId, 'date', signal), oneEntry(partyId, '-date', signal)]);
  return { count: earliest.total, first: earliest.items[0]?.workDate ?? null, last: latest.items[0]?.workDate ?? null };
}

// Filed under 'work-entries' so approving or billing an entry anywhere refreshes the span.
export function unbilledSpanQueryOptions(partyId: string) {
  return queryOptions({ queryKey: ['work-entries', 'unbilled-span', partyId], queryFn: ({ signal }) => getUnbilledSpan(partyId, signal) });
}

export function useUnbilledSpan(partyId: string | null) {
  return useQuery({ ...unbilledSpanQueryOptions(partyId ?? ''), enabled: Boolean(partyId) });
}
