import { useMutation } from '@tanstack/react-query';
import { downloadFile } from '../../../lib/fileTransfer';

export function downloadInvoicePdf(invoice: { id: string; numberLabel: string | null }) {
  return downloadFile(`/api/invoices/${encodeURIComponent(invoice.id)}/pdf`, undefined, `${invoice.numberLabel ?? 'draft-invoice'}.pdf`);
}

export function useDownloadInvoicePdf() {
  return useMutation({ mutationFn: downloadInvoicePdf });
}
