import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { WorkEntryPage, WorkEntryState } from '@hitchbook/shared/schemas/work-entries';
import { api } from '../../../lib/api';

/** The table's filters, as the API names them; also what the CSV export takes. */
export interface WorkEntryFilters {
  dateFrom: string | undefined;
  dateTo: string | undefined;
  machineId: string | undefined;
  fieldId: string | undefined;
  operatorUserId: string | undefined;
  billToPartyId: string | undefined;
  workTypeId: string | undefined;
  states: WorkEntryState[];
  sort: string;
}

export interface WorkEntryListQuery extends WorkEntryFilters {
  page: number;
  pageSize: number;
}

/** The filters as query parameters; several states travel comma-separated. */
export function filterQuery(filters: WorkEntryFilters): Record<string, string | undefined> {
  const { states, ...rest } = filters;
  return { ...rest, state: states.length > 0 ? states.join(',') : undefined };
}

export function listWorkEntries(query: WorkEntryListQuery, signal?: AbortSignal) {
  const { page, pageSize, ...filters } = query;
  return api.get<WorkEntryPage>('/api/work-entries', { query: { ...filterQuery(filters), page, pageSize }, signal });
}

export function workEntriesQueryOptions(query: WorkEntryListQuery) {
  return queryOptions({
    queryKey: ['work-entries', 'list', query],
    queryFn: ({ signal }) => listWorkEntries(query, signal),
    placeholderData: keepPreviousData,
  });
}

export function useWorkEntries(query: WorkEntryListQuery) {
  return useQuery(workEntriesQueryOptions(query));
}
