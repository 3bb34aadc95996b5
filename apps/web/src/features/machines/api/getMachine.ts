import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MachineDto } from '@hitchbook/shared/schemas/machines';
import { api } from '../../../lib/api';

export function getMachine(id: string, signal?: AbortSignal) {
  return api.get<MachineDto>(`/api/machines/${encodeURIComponent(id)}`, { signal });
}

export function machineQueryOptions(id: string) {
  return queryOptions({ queryKey: ['machines', 'detail', id], queryFn: ({ signal }) => getMachine(id, signal) });
}

export function useMachine(id: string) {
  return useQuery(machineQueryOptions(id));
}
