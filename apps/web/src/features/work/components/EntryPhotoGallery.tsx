import { useEffect, useState } from 'react';
import { Alert, Group, Image, Modal, Paper, Skeleton, Stack, Text, Title } from '@mantine/core';
import { useQuery } from '@tanstack/react-query';
import type { WorkEntryPhotoDto } from '@hitchbook/shared/schemas/work-entries';
import { QueryError } from '../../../components/QueryError';
import { fetchFile } from '../../../lib/fileTransfer';
import { useAttachEntryPhoto, useEntryPhotos, useRemoveEntryPhoto } from '../api/entryPhotos';
import { PhotoPicker } from './PhotoPicker';
import { PhotoThumb, THUMB_PX } from './PhotoThumb';

function usePhotoBlob(entryId: string, uploadId: string) {
  return useQuery({
    queryKey: ['work-entries', 'detail', entryId, 'photos', uploadId, 'file'],
    queryFn: () => fetchFile(`/api/work-entries/${encodeURIComponent(entryId)}/photos/${encodeURIComponent(uploadId)}`),
    staleTime: Infinity,
  });
}

function StoredPhoto({ entryId, photo, onRemove, removing, onOpen }: { entryId: string; photo: WorkEntryPhotoDto; onRemove?: () => void; removing: boolean; onOpen: (blob: Blob) => void }) {
  const blob = usePhotoBlob(entryId, photo.uploadId);
  return <PhotoThumb blob={blob.data} alt={photo.originalName} onRemove={onRemove} removing={removing} onOpen={blob.data ? () => onOpen(blob.data) : undefined} />;
}

function Enlarged({ blob, name, onClose }: { blob: Blob; name: string; onClose: () => void }) {
  const [url, setUrl] = useState<string | null>(null);
  useEffect(() => {
    const made = URL.createObjectURL(blob);
    setUrl(made);
    return () => URL.revokeObjectURL(made);
  }, [blob]);
  return (
    <Modal opened onClose={onClose} title={name} size="xl" centered>
      {url && <Image src={url} alt={name} radius="md" />}
    </Modal>
  );
}

/** The entry's photos as thumbnails; while the entry may change, photos are added and removed here. */
export function EntryPhotoGallery({ entryId, editable }: { entryId: string; editable: boolean }) {
  const photos = useEntryPhotos(entryId);
  const attach = useAttachEntryPhoto(entryId);
  const remove = useRemoveEntryPhoto(entryId);
  const [open, setOpen] = useState<{ blob: Blob; name: string } | null>(null);
  const [sending, setSending] = useState<File[]>([]);
  const [problem, setProblem] = useState<string | null>(null);

  const add = async (files: File[]) => {
    setProblem(null);
    setSending(files);
    for (const file of files) {
      try {
        await attach.mutateAsync({ file });
      } catch (err) {
        setProblem(`${file.name}: ${err instanceof Error ? err.message : 'not sent'}`);
      }
      setSending((left) => left.filter((f) => f !== file));
    }
  };

  return (
    <Paper withBorder radius="md" p="md" data-testid="entry-photos">
      <Stack gap="sm">
        <Title order={2} size="h4">
          Photos
        </Title>
        {photos.isError ? (
          <QueryError error={photos.error} onRetry={() => void photos.refetch()} />
        ) : !photos.data ? (
          <Skeleton h={THUMB_PX} />
        ) : (
          <>
            {photos.data.length === 0 && sending.length === 0 && <Text c="dimmed">No photos with this entry.</Text>}
            <Group gap="md" pt={editable ? 10 : 0}>
              {photos.data.map((photo) => (
                <StoredPhoto
                  key={photo.uploadId}
                  entryId={entryId}
                  photo={photo}
                  removing={remove.isPending && remove.variables === photo.uploadId}
                  onRemove={editable ? () => remove.mutate(photo.uploadId) : undefined}
                  onOpen={(blob) => setOpen({ blob, name: photo.originalName })}
                />
              ))}
              {sending.map((file, i) => (
                <PhotoThumb key={`sending-${i}`} blob={undefined} alt={file.name} />
              ))}
            </Group>
            {editable && <PhotoPicker files={[]} held={photos.data.length + sending.length} onChange={(files) => void add(files)} disabled={sending.length > 0} />}
          </>
        )}
        {(problem || remove.error) && (
          <Alert color="red" title="Photo not changed">
            {problem ?? remove.error?.message}
          </Alert>
        )}
      </Stack>
      {open && <Enlarged blob={open.blob} name={open.name} onClose={() => setOpen(null)} />}
    </Paper>
  );
}
