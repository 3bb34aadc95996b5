import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { CostCategory } from '@hitchbook/shared/actual-rate';
import type { CostEntryPage } from '@hitchbook/shared/schemas/machines';
import { api } from '../../../lib/api';

export interface CostFilters {
  page: number;
  pageSize: number;
  sort: string | undefined;
  category: CostCategory | undefined;
  from: string | undefined;
  to: string | undefined;
  paidByPartyId: string | undefined;
}

export function listCostEntries(machineId: string, filters: CostFilters, signal?: AbortSignal) {
  return api.get<CostEntryPage>(`/api/machines/${encodeURIComponent(machineId)}/costs`, { query: { ...filters }, signal });
}

export function costEntriesQueryOptions(machineId: string, filters: CostFilters) {
  return queryOptions({
    queryKey: ['machines', 'detail', machineId, 'costs', filters],
    queryFn: ({ signal }) => listCostEntries(machineId, filters, signal),
    placeholderData: keepPreviousData,
  });
}

export function useCostEntries(machineId: string, filters: CostFilters) {
  return useQuery(costEntriesQueryOptions(machineId, filters));
}
