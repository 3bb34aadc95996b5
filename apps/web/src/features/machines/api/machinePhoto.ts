import { useQuery } from '@tanstack/react-query';
import type { UploadDto } from '@hitchbook/shared/schemas/machines';
import { fetchFile, uploadFile } from '../../../lib/fileTransfer';

export function uploadMachinePhoto(file: File, onProgress?: (sent: number) => void) {
  return uploadFile<UploadDto>({ path: '/api/uploads', fields: { purpose: 'machine-photo' }, file, onProgress });
}

/** The photo's bytes fetched with the session's token: the upload route is not open to a bare <img src>. */
export function useMachinePhoto(uploadId: string | null) {
  return useQuery({
    queryKey: ['machines', 'photo', uploadId],
    queryFn: () => fetchFile(`/api/uploads/${encodeURIComponent(uploadId!)}`),
    enabled: uploadId !== null,
    // An upload never changes; a new photo is a new upload id.
    staleTime: Infinity,
  });
}
