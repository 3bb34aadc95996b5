import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { Page } from '@hitchbook/shared/schemas/common';
import type { FieldDto, FieldKind } from '@hitchbook/shared/schemas/fields';
import { api } from '../../../lib/api';
import type { ListParams } from '../../../lib/listParams';

export type ArchivedFilter = 'false' | 'true' | 'all';

export interface FieldFilters extends ListParams {
  kind: FieldKind | undefined;
  farmLabel: string | undefined;
  ownerPartyId: string | undefined;
  archived: ArchivedFilter;
}

export function listFields(filters: FieldFilters, signal?: AbortSignal) {
  return api.get<Page<FieldDto>>('/api/fields', { query: { ...filters }, signal });
}

export function fieldsQueryOptions(filters: FieldFilters) {
  return queryOptions({
    queryKey: ['fields', 'list', filters],
    queryFn: ({ signal }) => listFields(filters, signal),
    placeholderData: keepPreviousData,
  });
}

export function useFields(filters: FieldFilters) {
  return useQuery(fieldsQueryOptions(filters));
}
