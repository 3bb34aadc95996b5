import '@mantine/dropzone/styles.css';
import { useState, type ReactNode } from 'react';
import { Button, Group, Progress, Stack, Text } from '@mantine/core';
import { Dropzone, MIME_TYPES, type FileRejection } from '@mantine/dropzone';
import { IconFileUpload, IconReceipt, IconX } from '@tabler/icons-react';
import { MAX_UPLOAD_BYTES, type UploadDto } from '@hitchbook/shared/schemas/machines';
import { uploadReceipt } from '../api/uploadReceipt';

const ACCEPTED = [MIME_TYPES.pdf, MIME_TYPES.jpeg, MIME_TYPES.png];
const LIMIT_MB = MAX_UPLOAD_BYTES / (1024 * 1024);

function rejectionMessage(rejections: FileRejection[]): string {
  const code = rejections[0]?.errors[0]?.code;
  if (code === 'file-too-large') return `That file is over ${LIMIT_MB} MB. Take the photo at a lower resolution or scan to PDF.`;
  if (code === 'file-invalid-type') return 'Only PDF, JPEG or PNG receipts can be attached.';
  return 'Attach one receipt at a time.';
}

interface ReceiptDropzoneProps {
  receipt: UploadDto | null;
  onUploaded: (upload: UploadDto | null) => void;
  /** What the server said about the attached receipt when the cost was saved. */
  error?: ReactNode;
}

/**
 * The receipt goes up as soon as it is picked, so saving the cost only links it. The server
 * checks the content itself; the type and size checks here just save a wasted upload.
 */
export function ReceiptDropzone({ receipt, onUploaded, error: savedError }: ReceiptDropzoneProps) {
  const [progress, setProgress] = useState<number | null>(null);
  const [error, setError] = useState<string | null>(null);

  async function upload(file: File) {
    setError(null);
    setProgress(0);
    try {
      onUploaded(await uploadReceipt(file, setProgress));
    } catch (failure) {
      setError(failure instanceof Error ? failure.message : 'The receipt could not be uploaded.');
    } finally {
      setProgress(null);
    }
  }

  if (receipt) {
    return (
      <Stack gap={4}>
      <Group justify="space-between" gap="sm" wrap="nowrap" data-testid="receipt-attached">
        <Group gap="xs" wrap="nowrap" style={{ minWidth: 0 }}>
          <IconReceipt />
          <Text truncate>{receipt.originalName}</Text>
        </Group>
        <Button variant="subtle" color="red" leftSection={<IconX size={16} />} onClick={() => onUploaded(null)}>
          Remove
        </Button>
      </Group>
        {savedError && (
          <Text c="red.8" size="sm" role="alert">
            {savedError}
          </Text>
        )}
      </Stack>
    );
  }

  return (
    <Stack gap="xs">
      <Dropzone
        onDrop={(files) => files[0] && void upload(files[0])}
        onReject={(rejections) => setError(rejectionMessage(rejections))}
        accept={ACCEPTED}
        maxSize={MAX_UPLOAD_BYTES}
        multiple={false}
        loading={progress !== null}
        aria-label="Receipt"
      >
        <Group justify="center" gap="md" mih={88} style={{ pointerEvents: 'none' }}>
          <IconFileUpload size={36} stroke={1.5} />
          <Stack gap={0}>
            <Text fw={600}>Receipt: drop it here or tap to pick</Text>
            <Text size="sm" c="dimmed">
              PDF, JPEG or PNG, up to {LIMIT_MB} MB
            </Text>
          </Stack>
        </Group>
      </Dropzone>
      {progress !== null && <Progress value={progress * 100} animated aria-label="Uploading the receipt" />}
      {(error ?? savedError) && (
        <Text c="red.8" size="sm" role="alert">
          {error ?? savedError}
        </Text>
      )}
    </Stack>
  );
}
