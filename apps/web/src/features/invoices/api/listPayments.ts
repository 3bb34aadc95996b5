import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PaymentDto } from '@hitchbook/shared/schemas/invoices';
import { api } from '../../../lib/api';

export function listPayments(invoiceId: string, signal?: AbortSignal) {
  return api.get<PaymentDto[]>(`/api/invoices/${encodeURIComponent(invoiceId)}/payments`, { signal });
}

// Under the invoice's own key, so whatever refreshes the invoice refreshes its payments too.
export function paymentsQueryOptions(invoiceId: string) {
  return queryOptions({
    queryKey: ['invoices', 'detail', invoiceId, 'payments'],
    queryFn: ({ signal }) => listPayments(invoiceId, signal),
  });
}

export function usePayments(invoiceId: string, enabled: boolean) {
  return useQuery({ ...paymentsQueryOptions(invoiceId), enabled });
}
