import type { Page } from '@hitchbook/shared/schemas/common';
import type { MeterReadingDto } from '@hitchbook/shared/schemas/machines';
import { api } from '../../../lib/api';
import { KEEP_FOR_OFFLINE } from '../../offline/networkMode';

/** The newest reading comes first in the server's order: the meter start of the next pass. */
export function getLastMeterReading(machineId: string, signal?: AbortSignal) {
  return api
    .get<Page<MeterReadingDto>>(`/api/machines/${encodeURIComponent(machineId)}/meter-readings`, { query: { pageSize: 1 }, signal, headers: KEEP_FOR_OFFLINE })
    .then((page) => page.items[0] ?? null);
}
