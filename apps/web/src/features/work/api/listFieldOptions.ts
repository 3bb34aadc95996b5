import type { Page } from '@hitchbook/shared/schemas/common';
import type { FieldDto } from '@hitchbook/shared/schemas/fields';
import { api } from '../../../lib/api';
import { KEEP_FOR_OFFLINE } from '../../offline/networkMode';

export const FIELDS_IN_USE = { pageSize: 200, sort: 'name', archived: 'false' } as const;

/** Fields and road stretches still in use; an archived one stays on old entries but is not offered. */
export function listFieldOptions(signal?: AbortSignal) {
  return api.get<Page<FieldDto>>('/api/fields', { query: FIELDS_IN_USE, signal, headers: KEEP_FOR_OFFLINE }).then((page) => page.items);
}
