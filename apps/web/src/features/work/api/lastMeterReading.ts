import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Page } from '@hitchbook/shared/schemas/common';
import type { MeterReadingDto } from '@hitchbook/shared/schemas/machines';
import { api } from '../../../lib/api';
import { KEEP_FOR_OFFLINE, OFFLINE_FIRST } from '../../offline/networkMode';

/** The newest reading comes first in the server's order: the meter start of the next pass. */
export function getLastMeterReading(machineId: string, signal?: AbortSignal) {
  return api
    .get<Page<MeterReadingDto>>(`/api/machines/${encodeURIComponent(machineId)}/meter-readings`, { query: { pageSize: 1 }, signal, headers: KEEP_FOR_OFFLINE })
    .then((page) => page.items[0] ?? null);
}

export function lastMeterReadingQueryOptions(machineId: string) {
  return queryOptions({
    networkMode: OFFLINE_FIRST,
    queryKey: ['machines', 'detail', machineId, 'meter-readings', 'last'],
    queryFn: ({ signal }) => getLastMeterReading(machineId, signal),
  });
}

export function useLastMeterReading(machineId: string | null) {
  return useQuery({ ...lastMeterReadingQueryOptions(machineId ?? ''), enabled: Boolean(machineId) });
}
