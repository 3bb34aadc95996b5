import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { InvoiceDraftCreateInput, InvoiceDto } from '@hitchbook/shared/schemas/invoices';
import { api } from '../../../lib/api';
import { invalidateBilling } from './invalidate';

/** The server picks the party's approved, unbilled entries in the range and prices them line by line. */
export function createDraft(input: InvoiceDraftCreateInput) {
  return api.post<InvoiceDto>('/api/invoices/drafts', input);
}

export function useCreateDraft() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createDraft,
    onSuccess: async (draft) => {
      queryClient.setQueryData(['invoices', 'detail', draft.id], draft);
      await invalidateBilling(queryClient);
    },
  });
}
