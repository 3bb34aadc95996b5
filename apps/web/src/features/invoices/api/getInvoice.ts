import { queryOptions, useQuery } from '@tanstack/react-query';
import type { InvoiceDto } from '@hitchbook/shared/schemas/invoices';
import { api } from '../../../lib/api';

export function getInvoice(id: string, signal?: AbortSignal) {
  return api.get<InvoiceDto>(`/api/invoices/${encodeURIComponent(id)}`, { signal });
}

export function invoiceQueryOptions(id: string) {
  return queryOptions({ queryKey: ['invoices', 'detail', id], queryFn: ({ signal }) => getInvoice(id, signal) });
}

export function useInvoice(id: string) {
  return useQuery(invoiceQueryOptions(id));
}
