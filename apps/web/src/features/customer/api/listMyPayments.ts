import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PaymentDto } from '@hitchbook/shared/schemas/invoices';
import { api } from '../../../lib/api';

export function listMyPayments(invoiceId: string, signal?: AbortSignal) {
  return api.get<PaymentDto[]>(`/api/invoices/${encodeURIComponent(invoiceId)}/payments`, { signal });
}

// Under the invoice's key: when the invoice is fetched again after paying, its payments follow.
export function myPaymentsQueryOptions(invoiceId: string) {
  return queryOptions({ queryKey: ['my-invoices', 'detail', invoiceId, 'payments'], queryFn: ({ signal }) => listMyPayments(invoiceId, signal) });
}

export function useMyPayments(invoiceId: string, enabled = true) {
  return useQuery({ ...myPaymentsQueryOptions(invoiceId), enabled });
}
