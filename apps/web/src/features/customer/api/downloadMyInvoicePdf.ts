import { useMutation } from '@tanstack/react-query';
import { downloadFile } from '../../../lib/fileTransfer';

export function downloadMyInvoicePdf(invoice: { id: string; numberLabel: string | null }) {
  return downloadFile(`/api/invoices/${encodeURIComponent(invoice.id)}/pdf`, undefined, `${invoice.numberLabel ?? 'invoice'}.pdf`);
}

export function useDownloadMyInvoicePdf() {
  return useMutation({ mutationFn: downloadMyInvoicePdf });
}
