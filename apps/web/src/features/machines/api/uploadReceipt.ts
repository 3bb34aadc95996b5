import type { UploadDto } from '@hitchbook/shared/schemas/machines';
import { downloadFile, uploadFile } from '../../../lib/fileTransfer';

export function uploadReceipt(file: File, onProgress?: (sent: number) => void) {
  return uploadFile<UploadDto>({ path: '/api/uploads', fields: { purpose: 'receipt' }, file, onProgress });
}

export function downloadReceipt(uploadId: string) {
  return downloadFile(`/api/uploads/${encodeURIComponent(uploadId)}`, undefined, 'receipt');
}
