import type { Page } from '@hitchbook/shared/schemas/common';
import type { WorkTypeDto } from '@hitchbook/shared/schemas/work-types';
import { api } from '../../../lib/api';
import { KEEP_FOR_OFFLINE } from '../../offline/networkMode';

export function listWorkTypes(signal?: AbortSignal) {
  return api.get<Page<WorkTypeDto>>('/api/work-types', { query: { pageSize: 100 }, signal, headers: KEEP_FOR_OFFLINE }).then((page) => page.items);
}
