import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { WorkEntryPhotoDto } from '@hitchbook/shared/schemas/work-entries';
import { api } from '../../../lib/api';
import { fetchFile, uploadFile } from '../../../lib/fileTransfer';

const photosPath = (entryId: string) => `/api/work-entries/${encodeURIComponent(entryId)}/photos`;
const photoKey = (entryId: string) => ['work-entries', 'detail', entryId, 'photos'] as const;

export function entryPhotosQueryOptions(entryId: string) {
  return queryOptions({ queryKey: photoKey(entryId), queryFn: ({ signal }) => api.get<WorkEntryPhotoDto[]>(photosPath(entryId), { signal }) });
}

export function useEntryPhotos(entryId: string) {
  return useQuery(entryPhotosQueryOptions(entryId));
}

/** Sends one photo of a saved entry; the entry itself goes first, through saveWorkEntry. */
export function attachEntryPhoto(entryId: string, file: File, onProgress?: (sent: number) => void): Promise<WorkEntryPhotoDto> {
  return uploadFile<WorkEntryPhotoDto>({ path: photosPath(entryId), file, onProgress });
}

export function useAttachEntryPhoto(entryId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ file, onProgress }: { file: File; onProgress?: (sent: number) => void }) => attachEntryPhoto(entryId, file, onProgress),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: photoKey(entryId) }),
  });
}

export function useRemoveEntryPhoto(entryId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (uploadId: string) => api.delete<void>(`${photosPath(entryId)}/${encodeURIComponent(uploadId)}`),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: photoKey(entryId) }),
  });
}

/** A photo as an object URL for an <img>: the file needs the session's token, which an <img src> cannot send. */
export function useEntryPhotoUrl(entryId: string, uploadId: string) {
  return useQuery({
    queryKey: [...photoKey(entryId), uploadId, 'file'],
    queryFn: async () => URL.createObjectURL(await fetchFile(`${photosPath(entryId)}/${encodeURIComponent(uploadId)}`)),
    staleTime: Infinity,
    gcTime: 5 * 60 * 1000,
  });
}
