import { useRef, useState } from 'react';
import { Alert, Button, Group, Stack, Text } from '@mantine/core';
import { IconCamera } from '@tabler/icons-react';
import { choosePhotos, type PhotoLimits } from '../photoChoice';
import { downscalePhoto } from '../photoScale';
import { PhotoThumb } from './PhotoThumb';

interface PhotoPickerProps {
  files: File[];
  onChange: (files: File[]) => void;
  /** Photos the entry holds already, so the limit counts them. */
  held?: number;
  disabled?: boolean;
  /** Tighter than the server's when the photos may have to wait on the phone. */
  limits?: PhotoLimits;
}

/**
 * Photos chosen on the device: on a phone the button opens the camera (a file picker elsewhere).
 * They stay here until the entry is saved, then go up one by one.
 */
export function PhotoPicker({ files, onChange, held = 0, disabled, limits }: PhotoPickerProps) {
  const input = useRef<HTMLInputElement>(null);
  const [refused, setRefused] = useState<string[]>([]);
  const [preparing, setPreparing] = useState(false);

  return (
    <Stack gap="sm">
      {files.length > 0 && (
        <Group gap="md" pt={10}>
          {files.map((file, i) => (
            <PhotoThumb key={`${file.name}-${file.lastModified}-${i}`} blob={file} alt={file.name} onRemove={() => onChange(files.filter((_, j) => j !== i))} />
          ))}
        </Group>
      )}
      <input
        ref={input}
        type="file"
        accept="image/*"
        capture="environment"
        multiple
        hidden
        data-testid="entry-photo-input"
        onChange={(event) => {
          const picked = Array.from(event.currentTarget.files ?? []);
          // The same photo can be picked again after it was removed.
          event.currentTarget.value = '';
          setPreparing(true);
          void Promise.all(picked.map(downscalePhoto))
            .then((scaled) => {
              const choice = choosePhotos(scaled, held + files.length, limits);
              setRefused(choice.refused);
              if (choice.accepted.length > 0) onChange([...files, ...choice.accepted]);
            })
            .finally(() => setPreparing(false));
        }}
      />
      <Button size="lg" variant="default" leftSection={<IconCamera />} onClick={() => input.current?.click()} disabled={disabled} loading={preparing}>
        {files.length > 0 ? 'Add another photo' : 'Take or add a photo'}
      </Button>
      {refused.length > 0 && (
        <Alert color="orange" title="Not attached" data-testid="photo-refused">
          {refused.map((line) => (
            <Text key={line} size="sm">
              {line}
            </Text>
          ))}
        </Alert>
      )}
    </Stack>
  );
}
