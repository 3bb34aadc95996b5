import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { InvoiceDto } from '@hitchbook/shared/schemas/invoices';
import { api } from '../../../lib/api';
import { invalidateBilling } from './invalidate';

export interface CreditNoteRequest {
  reason: string;
  /** Left out to credit every line of the invoice. */
  lines?: Array<{ description: string; amount: string }>;
}

/** A fresh key per submit, so a resent request makes one credit note and never two. */
export function createCreditNote(invoiceId: string, input: CreditNoteRequest) {
  return api.post<InvoiceDto>(`/api/invoices/${encodeURIComponent(invoiceId)}/credit-notes`, input, {
    headers: { 'Idempotency-Key': crypto.randomUUID() },
  });
}

export function useCreateCreditNote(invoiceId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CreditNoteRequest) => createCreditNote(invoiceId, input),
    onSuccess: async (note) => {
      queryClient.setQueryData(['invoices', 'detail', note.id], note);
      await invalidateBilling(queryClient);
    },
  });
}
