import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { InvoiceDraftUpdateInput, InvoiceDto } from '@hitchbook/shared/schemas/invoices';
import { api } from '../../../lib/api';
import { invalidateBilling } from './invalidate';

/** Sends the version the owner edited; a draft changed since in another tab answers 409. */
export function updateDraft(id: string, input: InvoiceDraftUpdateInput) {
  return api.patch<InvoiceDto>(`/api/invoices/${encodeURIComponent(id)}`, input);
}

export function useUpdateDraft(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: InvoiceDraftUpdateInput) => updateDraft(id, input),
    onSuccess: async (draft) => {
      queryClient.setQueryData(['invoices', 'detail', id], draft);
      await invalidateBilling(queryClient);
    },
  });
}

/**
 * One kind of change to a draft (an added line, a discount, a note), sent as a draft update built
 * from the draft as last loaded, so each modal submits just its own fields.
 */
export function useDraftChange<T>(id: string, toUpdate: (input: T) => InvoiceDraftUpdateInput) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: T) => updateDraft(id, toUpdate(input)),
    onSuccess: async (draft: InvoiceDto) => {
      queryClient.setQueryData(['invoices', 'detail', id], draft);
      await invalidateBilling(queryClient);
    },
  });
}
