import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { Page } from '@hitchbook/shared/schemas/common';
import type { MachineDto, MachineStatus } from '@hitchbook/shared/schemas/machines';
import type { MachineKind } from '@hitchbook/shared/machine-classes';
import { api } from '../../../lib/api';
import type { ListParams } from '../../../lib/listParams';

export interface MachineFilters extends ListParams {
  status: MachineStatus | undefined;
  kind: MachineKind | undefined;
  classId: string | undefined;
}

export function listMachines(filters: MachineFilters, signal?: AbortSignal) {
  return api.get<Page<MachineDto>>('/api/machines', { query: { ...filters }, signal });
}

export function machinesQueryOptions(filters: MachineFilters) {
  return queryOptions({
    queryKey: ['machines', 'list', filters],
    queryFn: ({ signal }) => listMachines(filters, signal),
    placeholderData: keepPreviousData,
  });
}

export function useMachines(filters: MachineFilters) {
  return useQuery(machinesQueryOptions(filters));
}
