import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { Page } from '@hitchbook/shared/schemas/common';
import type { RateRelationship, RateSheetListItemDto } from '@hitchbook/shared/schemas/rate-sheets';
import { api } from '../../../lib/api';

export interface RateSheetFilters {
  page: number;
  pageSize: number;
  sort: string | undefined;
  relationship: RateRelationship | undefined;
  includeArchived: boolean;
}

export function listRateSheets(filters: RateSheetFilters, signal?: AbortSignal) {
  const { includeArchived, ...rest } = filters;
  return api.get<Page<RateSheetListItemDto>>('/api/rate-sheets', {
    query: { ...rest, includeArchived: includeArchived ? 'true' : undefined },
    signal,
  });
}

export function rateSheetsQueryOptions(filters: RateSheetFilters) {
  return queryOptions({
    queryKey: ['rate-sheets', 'list', filters],
    queryFn: ({ signal }) => listRateSheets(filters, signal),
    placeholderData: keepPreviousData,
  });
}

export function useRateSheets(filters: RateSheetFilters) {
  return useQuery(rateSheetsQueryOptions(filters));
}
