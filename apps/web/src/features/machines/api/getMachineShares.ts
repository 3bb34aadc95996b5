import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MachineSharesDto } from '@hitchbook/shared/schemas/machines';
import { api } from '../../../lib/api';

export function getMachineShares(id: string, signal?: AbortSignal) {
  return api.get<MachineSharesDto>(`/api/machines/${encodeURIComponent(id)}/shares`, { signal });
}

export function machineSharesQueryOptions(id: string) {
  return queryOptions({ queryKey: ['machines', 'detail', id, 'shares'], queryFn: ({ signal }) => getMachineShares(id, signal) });
}

export function useMachineShares(id: string) {
  return useQuery(machineSharesQueryOptions(id));
}
