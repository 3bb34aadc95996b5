import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { MachineSummaryDto } from '@hitchbook/shared/schemas/machines';
import { api } from '../../../lib/api';

export function getMachineSummary(id: string, year: number, signal?: AbortSignal) {
  return api.get<MachineSummaryDto>(`/api/machines/${encodeURIComponent(id)}/summary`, { query: { year }, signal });
}

export function machineSummaryQueryOptions(id: string, year: number) {
  return queryOptions({
    queryKey: ['machines', 'detail', id, 'summary', year],
    queryFn: ({ signal }) => getMachineSummary(id, year, signal),
    // Switching the year keeps the page on screen instead of flashing a loader.
    placeholderData: keepPreviousData,
  });
}

export function useMachineSummary(id: string, year: number) {
  return useQuery(machineSummaryQueryOptions(id, year));
}
