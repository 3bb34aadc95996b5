import { useState, type ReactNode } from 'react';
import { Button, FileInput, Group, Progress, Stack, Text } from '@mantine/core';
import { IconMapPin, IconX } from '@tabler/icons-react';
import { MAX_UPLOAD_BYTES, type UploadDto } from '@hitchbook/shared/schemas/machines';
import { uploadBoundary } from '../api/uploadBoundary';

interface BoundaryUploadProps {
  onUploaded: (upload: UploadDto | null) => void;
  /** What the server said about the file when the field was saved (a ring that does not close). */
  error?: ReactNode;
}

/** The file goes up when picked; saving the field attaches it, and the server checks the shape. */
export function BoundaryUpload({ onUploaded, error: savedError }: BoundaryUploadProps) {
  const [file, setFile] = useState<UploadDto | null>(null);
  const [progress, setProgress] = useState<number | null>(null);
  const [error, setError] = useState<string | null>(null);

  async function pick(picked: File | null) {
    setError(null);
    if (!picked) return;
    if (picked.size > MAX_UPLOAD_BYTES) {
      setError('That file is over 10 MB; simplify the boundary first.');
      return;
    }
    setProgress(0);
    try {
      const upload = await uploadBoundary(picked, setProgress);
      setFile(upload);
      onUploaded(upload);
    } catch (failure) {
      setError(failure instanceof Error ? failure.message : 'The boundary could not be uploaded.');
    } finally {
      setProgress(null);
    }
  }

  if (file) {
    return (
      <Stack gap={4}>
        <Group justify="space-between" wrap="nowrap" data-testid="boundary-attached">
          <Group gap="xs" wrap="nowrap" style={{ minWidth: 0 }}>
            <IconMapPin />
            <Text truncate>{file.originalName}: attached when you save</Text>
          </Group>
          <Button
            variant="subtle"
            color="red"
            leftSection={<IconX size={16} />}
            onClick={() => {
              setFile(null);
              onUploaded(null);
            }}
          >
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
      <FileInput
        size="md"
        label="Boundary file"
        description="GeoJSON (.geojson or .json) with a Polygon or MultiPolygon, longitude first. Its acres are shown beside the entered ones."
        placeholder="Pick a GeoJSON file"
        accept=".geojson,.json,application/geo+json,application/json"
        leftSection={<IconMapPin size={18} />}
        value={null}
        onChange={(picked) => void pick(picked)}
        error={error ?? savedError}
        disabled={progress !== null}
      />
      {progress !== null && <Progress value={progress * 100} animated aria-label="Uploading the boundary" />}
    </Stack>
  );
}
