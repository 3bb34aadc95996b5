import type { Page } from '@hitchbook/shared/schemas/common';
import type { MachineDto } from '@hitchbook/shared/schemas/machines';
import { api } from '../../../lib/api';
import { KEEP_FOR_OFFLINE } from '../../offline/networkMode';

export const ACTIVE_MACHINES = { status: 'active', pageSize: 200, sort: 'name' } as const;

/** Every machine still in use, for the pickers of the cab form and the table's filter. */
export function listMachineOptions(signal?: AbortSignal) {
  return api.get<Page<MachineDto>>('/api/machines', { query: ACTIVE_MACHINES, signal, headers: KEEP_FOR_OFFLINE }).then((page) => page.items);
}
