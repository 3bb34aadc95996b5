import type { UploadDto } from '@hitchbook/shared/schemas/machines';
import { uploadFile } from '../../../lib/fileTransfer';

/** Boundaries go up as files: a surveyed edge is often larger than a JSON request may be. */
export function uploadBoundary(file: File, onProgress?: (sent: number) => void) {
  return uploadFile<UploadDto>({ path: '/api/uploads', fields: { purpose: 'field-boundary' }, file, onProgress });
}
