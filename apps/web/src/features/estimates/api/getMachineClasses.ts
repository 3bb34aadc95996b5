import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MachineClassResponse } from '@hitchbook/shared/estimates';
import { api } from '../../../lib/api';

export function getMachineClasses(signal?: AbortSignal) {
  return api.get<MachineClassResponse[]>('/api/estimates/machine-classes', { signal });
}

export function machineClassesQueryOptions() {
  return queryOptions({
    queryKey: ['estimates', 'machine-classes'],
    queryFn: ({ signal }) => getMachineClasses(signal),
    // The published coefficients change with a new edition of the standard, not during a visit.
    staleTime: Infinity,
  });
}

export function useMachineClasses() {
  return useQuery(machineClassesQueryOptions());
}
