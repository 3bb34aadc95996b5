import { queryOptions, useQuery } from '@tanstack/react-query';
import type { InvoiceDto } from '@hitchbook/shared/schemas/invoices';
import { api } from '../../../lib/api';

export function getMyInvoice(id: string, signal?: AbortSignal) {
  return api.get<InvoiceDto>(`/api/invoices/${encodeURIComponent(id)}`, { signal });
}

export function myInvoiceQueryOptions(id: string) {
  return queryOptions({ queryKey: ['my-invoices', 'detail', id], queryFn: ({ signal }) => getMyInvoice(id, signal) });
}

/** `pollMs` keeps asking while a card payment is being confirmed; false asks once. */
export function useMyInvoice(id: string, pollMs: number | false = false) {
  return useQuery({ ...myInvoiceQueryOptions(id), refetchInterval: pollMs });
}
