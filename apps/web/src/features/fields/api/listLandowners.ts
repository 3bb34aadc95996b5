import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Page } from '@hitchbook/shared/schemas/common';
import { api } from '../../../lib/api';

export interface Landowner {
  id: string;
  name: string;
  kind: 'household' | 'customer';
}

const EVERY_PARTY = { pageSize: 200, sort: 'name' } as const;

/** A field's landlord or owner is a household of the outfit or a customer. */
export function listLandowners(signal?: AbortSignal) {
  return api.get<Page<Landowner>>('/api/parties', { query: EVERY_PARTY, signal });
}

export function landownersQueryOptions() {
  return queryOptions({ queryKey: ['parties', 'list', EVERY_PARTY], queryFn: ({ signal }) => listLandowners(signal), select: (page) => page.items });
}

export function useLandowners() {
  return useQuery(landownersQueryOptions());
}
