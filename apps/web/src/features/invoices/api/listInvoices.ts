import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { Page } from '@hitchbook/shared/schemas/common';
import type { InvoiceSummaryDto } from '@hitchbook/shared/schemas/invoices';
import { api } from '../../../lib/api';
import type { InvoiceFilters } from '../invoiceFilters';

export interface InvoiceListFilters extends InvoiceFilters {
  page: number;
  pageSize: number;
  sort: string | undefined;
}

export function listInvoices(filters: InvoiceListFilters, signal?: AbortSignal) {
  return api.get<Page<InvoiceSummaryDto>>('/api/invoices', { query: { ...filters }, signal });
}

export function invoicesQueryOptions(filters: InvoiceListFilters) {
  return queryOptions({
    queryKey: ['invoices', 'list', filters],
    queryFn: ({ signal }) => listInvoices(filters, signal),
    placeholderData: keepPreviousData,
  });
}

export function useInvoices(filters: InvoiceListFilters) {
  return useQuery(invoicesQueryOptions(filters));
}
