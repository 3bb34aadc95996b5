import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { MachineRatesReportDto } from '@hitchbook/shared/schemas/reports';
import { api } from '../../../lib/api';

export function getMachineRates(year: number, signal?: AbortSignal) {
  return api.get<MachineRatesReportDto>('/api/reports/machine-rates', { query: { year }, signal });
}

export function machineRatesQueryOptions(year: number) {
  return queryOptions({
    queryKey: ['reports', 'machine-rates', year],
    queryFn: ({ signal }) => getMachineRates(year, signal),
    // Switching the year keeps the report on screen instead of flashing a loader.
    placeholderData: keepPreviousData,
  });
}

export function useMachineRates(year: number) {
  return useQuery(machineRatesQueryOptions(year));
}
