import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ManualPaymentResultDto } from '@hitchbook/shared/schemas/invoices';
import { api } from '../../../lib/api';
import { invalidateBilling } from './invalidate';

export interface RefundRequest {
  amount: string;
  reason: string | null;
}

export function refundPayment(invoiceId: string, paymentId: string, input: RefundRequest) {
  return api.post<ManualPaymentResultDto>(`/api/invoices/${encodeURIComponent(invoiceId)}/payments/${encodeURIComponent(paymentId)}/refund`, input);
}

export function useRefundPayment(invoiceId: string, paymentId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: RefundRequest) => refundPayment(invoiceId, paymentId, input),
    onSuccess: () => invalidateBilling(queryClient),
  });
}
