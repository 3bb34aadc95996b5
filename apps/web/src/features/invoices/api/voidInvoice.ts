import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { InvoiceDto } from '@hitchbook/shared/schemas/invoices';
import { api } from '../../../lib/api';
import { invalidateBilling } from './invalidate';

export function voidInvoice(id: string, input: { reason: string }) {
  return api.post<InvoiceDto>(`/api/invoices/${encodeURIComponent(id)}/void`, input);
}

export function useVoidInvoice(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { reason: string }) => voidInvoice(id, input),
    onSuccess: async (invoice) => {
      queryClient.setQueryData(['invoices', 'detail', id], invoice);
      await invalidateBilling(queryClient);
    },
  });
}
