import '@mantine/dropzone/styles.css';
import { useEffect, useState } from 'react';
import { Alert, Button, Group, Image, Paper, Progress, Skeleton, Stack, Text, Title } from '@mantine/core';
import { Dropzone, MIME_TYPES, type FileRejection } from '@mantine/dropzone';
import { IconPhoto, IconPhotoUp, IconTrash } from '@tabler/icons-react';
import { MAX_UPLOAD_BYTES, type MachineDto } from '@hitchbook/shared/schemas/machines';
import { uploadMachinePhoto, useMachinePhoto } from '../api/machinePhoto';
import { useUpdateMachine } from '../api/updateMachine';

const ACCEPTED = [MIME_TYPES.jpeg, MIME_TYPES.png];
const LIMIT_MB = MAX_UPLOAD_BYTES / (1024 * 1024);

function rejectionMessage(rejections: FileRejection[]): string {
  const code = rejections[0]?.errors[0]?.code;
  if (code === 'file-too-large') return `That photo is over ${LIMIT_MB} MB. Take it at a lower resolution or shrink it first.`;
  if (code === 'file-invalid-type') return 'Only a JPEG or PNG photo can be used.';
  return 'Pick one photo at a time.';
}

function useObjectUrl(blob: Blob | undefined): string | null {
  const [url, setUrl] = useState<string | null>(null);
  useEffect(() => {
    if (!blob) return setUrl(null);
    const made = URL.createObjectURL(blob);
    setUrl(made);
    return () => URL.revokeObjectURL(made);
  }, [blob]);
  return url;
}

/** The machine's photo; owners and partners of the machine pick or replace it here. */
export function MachinePhotoPanel({ machine, canManage }: { machine: MachineDto; canManage: boolean }) {
  const photo = useMachinePhoto(machine.photoUploadId);
  const url = useObjectUrl(photo.data);
  const update = useUpdateMachine(machine.id);
  const [progress, setProgress] = useState<number | null>(null);
  const [error, setError] = useState<string | null>(null);

  async function replace(file: File) {
    setError(null);
    setProgress(0);
    try {
      const upload = await uploadMachinePhoto(file, setProgress);
      await update.mutateAsync({ photoUploadId: upload.id });
    } catch (failure) {
      setError(failure instanceof Error ? failure.message : 'The photo could not be uploaded.');
    } finally {
      setProgress(null);
    }
  }

  async function remove() {
    setError(null);
    try {
      await update.mutateAsync({ photoUploadId: null });
    } catch (failure) {
      setError(failure instanceof Error ? failure.message : 'The photo could not be removed.');
    }
  }

  if (!canManage && !machine.photoUploadId) return null;
  const busy = progress !== null || update.isPending;

  return (
    <Paper withBorder p="md" radius="md" data-testid="machine-photo">
      <Stack gap="sm">
        <Group justify="space-between">
          <Title order={2} size="h4">
            Photo
          </Title>
          {canManage && machine.photoUploadId && (
            <Button variant="subtle" color="red" leftSection={<IconTrash size={16} />} onClick={() => void remove()} disabled={busy}>
              Remove photo
            </Button>
          )}
        </Group>
        {machine.photoUploadId &&
          (photo.isError ? (
            <Alert color="red" icon={<IconPhoto />}>
              The photo could not be loaded. {photo.error instanceof Error ? photo.error.message : ''}
            </Alert>
          ) : url ? (
            <Image src={url} alt={`Photo of ${machine.name}`} radius="md" mah={360} fit="contain" />
          ) : (
            <Skeleton h={240} radius="md" />
          ))}
        {canManage && (
          <Dropzone
            onDrop={(files) => files[0] && void replace(files[0])}
            onReject={(rejections) => setError(rejectionMessage(rejections))}
            accept={ACCEPTED}
            maxSize={MAX_UPLOAD_BYTES}
            multiple={false}
            loading={busy}
            aria-label={machine.photoUploadId ? 'Replace the photo' : 'Add a photo'}
          >
            <Group justify="center" gap="md" mih={72} style={{ pointerEvents: 'none' }}>
              <IconPhotoUp size={32} stroke={1.5} />
              <Stack gap={0}>
                <Text fw={600}>{machine.photoUploadId ? 'Replace the photo' : 'Add a photo'}: drop it here or tap to pick</Text>
                <Text size="sm" c="dimmed">
                  JPEG or PNG, up to {LIMIT_MB} MB
                </Text>
              </Stack>
            </Group>
          </Dropzone>
        )}
        {progress !== null && <Progress value={progress * 100} animated aria-label="Uploading the photo" />}
        {error && (
          <Text c="red.8" size="sm" role="alert">
            {error}
          </Text>
        )}
      </Stack>
    </Paper>
  );
}
