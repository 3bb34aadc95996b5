import { queryOptions, useQuery } from '@tanstack/react-query';
import type { WorkEntryWithWarnings } from '@hitchbook/shared/schemas/work-entries';
import { api } from '../../../lib/api';

export function getWorkEntry(id: string, signal?: AbortSignal) {
  return api.get<WorkEntryWithWarnings>(`/api/work-entries/${encodeURIComponent(id)}`, { signal });
}

export function workEntryQueryOptions(id: string) {
  return queryOptions({ queryKey: ['work-entries', 'detail', id], queryFn: ({ signal }) => getWorkEntry(id, signal) });
}

export function useWorkEntry(id: string) {
  return useQuery(workEntryQueryOptions(id));
}
