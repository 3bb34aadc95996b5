import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { WorkEntryPage } from '@hitchbook/shared/schemas/work-entries';
import { api } from '../../../lib/api';

export interface MachineEntryFilters {
  machineId: string;
  page: number;
  pageSize: number;
  sort: string | undefined;
}

/** The work entries the machine ran on, as a power unit or as the implement. */
export function listMachineEntries(filters: MachineEntryFilters, signal?: AbortSignal) {
  return api.get<WorkEntryPage>('/api/work-entries', { query: { ...filters }, signal });
}

export function machineEntriesQueryOptions(filters: MachineEntryFilters) {
  return queryOptions({
    queryKey: ['work-entries', 'list', filters],
    queryFn: ({ signal }) => listMachineEntries(filters, signal),
    placeholderData: keepPreviousData,
  });
}

export function useMachineEntries(filters: MachineEntryFilters) {
  return useQuery(machineEntriesQueryOptions(filters));
}
