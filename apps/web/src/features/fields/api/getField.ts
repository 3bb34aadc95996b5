import { queryOptions, useQuery } from '@tanstack/react-query';
import type { FieldDto } from '@hitchbook/shared/schemas/fields';
import { api } from '../../../lib/api';

export function getField(id: string, signal?: AbortSignal) {
  return api.get<FieldDto>(`/api/fields/${encodeURIComponent(id)}`, { signal });
}

export function fieldQueryOptions(id: string) {
  return queryOptions({ queryKey: ['fields', 'detail', id], queryFn: ({ signal }) => getField(id, signal) });
}

export function useField(id: string) {
  return useQuery(fieldQueryOptions(id));
}
