import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Page } from '@hitchbook/shared/schemas/common';
import { api } from '../../../lib/api';

export interface CustomerOption {
  id: string;
  name: string;
  email: string | null;
}

/** Only customers are invoiced; households square up instead. */
export function listCustomerOptions(signal?: AbortSignal) {
  return api.get<Page<CustomerOption>>('/api/parties', { query: { kind: 'customer', pageSize: 200, sort: 'name' }, signal });
}

// Filed under 'parties' so that adding or renaming a customer refreshes the picker too.
export function customerOptionsQueryOptions() {
  return queryOptions({
    queryKey: ['parties', 'options', 'customer', 'invoices'],
    queryFn: ({ signal }) => listCustomerOptions(signal),
    select: (page) => page.items,
  });
}

export function useCustomerOptions() {
  return useQuery(customerOptionsQueryOptions());
}
