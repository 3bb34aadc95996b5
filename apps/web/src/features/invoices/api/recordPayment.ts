import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ManualPaymentResultDto } from '@hitchbook/shared/schemas/invoices';
import { api } from '../../../lib/api';
import { invalidateBilling } from './invalidate';

export interface ManualPaymentRequest {
  method: 'cheque' | 'cash' | 'transfer';
  amount: string;
  receivedOn: string;
  reference: string | null;
}

export function recordPayment(invoiceId: string, input: ManualPaymentRequest) {
  return api.post<ManualPaymentResultDto>(`/api/invoices/${encodeURIComponent(invoiceId)}/payments`, input);
}

export function useRecordPayment(invoiceId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ManualPaymentRequest) => recordPayment(invoiceId, input),
    onSuccess: () => invalidateBilling(queryClient),
  });
}
