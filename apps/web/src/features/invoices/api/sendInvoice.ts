import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { InvoiceSendDto } from '@hitchbook/shared/schemas/invoices';
import { api } from '../../../lib/api';
import { invalidateBilling } from './invalidate';

/** Queues the e-mail with the PDF and the pay link; the server retries a failed send on its own. */
export function sendInvoice(invoiceId: string, input: { to?: string }) {
  return api.post<InvoiceSendDto>(`/api/invoices/${encodeURIComponent(invoiceId)}/send`, input);
}

export function useSendInvoice(invoiceId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { to?: string }) => sendInvoice(invoiceId, input),
    onSuccess: () => invalidateBilling(queryClient),
  });
}
