import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RateSheetDto } from '@hitchbook/shared/schemas/rate-sheets';
import { api } from '../../../lib/api';

export function getRateSheet(id: string, signal?: AbortSignal) {
  return api.get<RateSheetDto>(`/api/rate-sheets/${encodeURIComponent(id)}`, { signal });
}

export function rateSheetQueryOptions(id: string) {
  return queryOptions({ queryKey: ['rate-sheets', 'detail', id], queryFn: ({ signal }) => getRateSheet(id, signal) });
}

export function useRateSheet(id: string) {
  return useQuery(rateSheetQueryOptions(id));
}
