import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MachineHoursHistoryDto } from '@hitchbook/shared/schemas/reports';
import { api } from '../../../lib/api';

export function getMachineHours(signal?: AbortSignal) {
  return api.get<MachineHoursHistoryDto>('/api/reports/machine-hours', { signal });
}

export function machineHoursQueryOptions() {
  return queryOptions({ queryKey: ['reports', 'machine-hours'], queryFn: ({ signal }) => getMachineHours(signal) });
}

export function useMachineHours() {
  return useQuery(machineHoursQueryOptions());
}
