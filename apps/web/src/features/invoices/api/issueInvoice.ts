import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { InvoiceDto } from '@hitchbook/shared/schemas/invoices';
import { api } from '../../../lib/api';
import { invalidateBilling } from './invalidate';

export interface IssueRequest {
  version: number;
  /** One per click on Issue: a resend of the same click gets the same number, a new click is a new request. */
  idempotencyKey: string;
}

export function issueInvoice(id: string, { version, idempotencyKey }: IssueRequest) {
  return api.post<InvoiceDto>(`/api/invoices/${encodeURIComponent(id)}/issue`, { version }, { headers: { 'Idempotency-Key': idempotencyKey } });
}

export function useIssueInvoice(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (request: IssueRequest) => issueInvoice(id, request),
    onSuccess: async (invoice) => {
      queryClient.setQueryData(['invoices', 'detail', id], invoice);
      await invalidateBilling(queryClient);
    },
  });
}
