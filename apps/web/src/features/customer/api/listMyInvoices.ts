import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { Page } from '@hitchbook/shared/schemas/common';
import type { InvoiceSummaryDto } from '@hitchbook/shared/schemas/invoices';
import { api } from '../../../lib/api';
import type { ListParams } from '../../../lib/listParams';

type MyInvoiceFilters = Pick<ListParams, 'page' | 'pageSize' | 'sort'>;

/** The server answers a customer with their own issued invoices only. */
export function listMyInvoices(filters: MyInvoiceFilters, signal?: AbortSignal) {
  return api.get<Page<InvoiceSummaryDto>>('/api/invoices', { query: { ...filters }, signal });
}

export function myInvoicesQueryOptions(filters: MyInvoiceFilters) {
  return queryOptions({
    queryKey: ['my-invoices', 'list', filters],
    queryFn: ({ signal }) => listMyInvoices(filters, signal),
    placeholderData: keepPreviousData,
  });
}

export function useMyInvoices(filters: MyInvoiceFilters) {
  return useQuery(myInvoicesQueryOptions(filters));
}
