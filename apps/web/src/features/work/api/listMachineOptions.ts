import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Page } from '@hitchbook/shared/schemas/common';
import type { MachineDto } from '@hitchbook/shared/schemas/machines';
import { api } from '../../../lib/api';
import { KEEP_FOR_OFFLINE, OFFLINE_FIRST } from '../../offline/networkMode';

const ACTIVE_MACHINES = { status: 'active', pageSize: 200, sort: 'name' } as const;

/** Every machine still in use, for the pickers of the cab form and the table's filter. */
export function listMachineOptions(signal?: AbortSignal) {
  return api.get<Page<MachineDto>>('/api/machines', { query: ACTIVE_MACHINES, signal, headers: KEEP_FOR_OFFLINE }).then((page) => page.items);
}

export function machineOptionsQueryOptions() {
  return queryOptions({ networkMode: OFFLINE_FIRST, queryKey: ['machines', 'list', ACTIVE_MACHINES, 'options'], queryFn: ({ signal }) => listMachineOptions(signal), staleTime: 60_000 });
}

export function useMachineOptions() {
  return useQuery(machineOptionsQueryOptions());
}
