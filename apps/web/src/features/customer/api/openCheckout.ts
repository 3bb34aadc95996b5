import { useMutation } from '@tanstack/react-query';
import type { CheckoutDto } from '@hitchbook/shared/schemas/invoices';
import { api } from '../../../lib/api';

/** Sends no amount: the server charges the open balance it holds, never a figure from the browser. */
export function openCheckout(invoiceId: string) {
  return api.post<CheckoutDto>(`/api/invoices/${encodeURIComponent(invoiceId)}/checkout`, {});
}

export function useOpenCheckout(invoiceId: string) {
  return useMutation({ mutationFn: () => openCheckout(invoiceId) });
}
