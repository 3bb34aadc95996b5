import { lazy, Suspense, useRef, useState } from 'react';
import { Alert, Button, Group, Stack, Text } from '@mantine/core';
import { IconCamera } from '@tabler/icons-react';
import type { PhotoLimits } from '../photoChoice';

// The picker is on the cab form; what handles a picked photo loads when the first one is picked.
const PhotoThumb = lazy(() => import('./PhotoThumb').then((module) => ({ default: module.PhotoThumb })));

async function preparePhotos(picked: readonly File[], alreadyHeld: number, limits?: PhotoLimits) {
  const [{ downscalePhoto }, { choosePhotos }] = await Promise.all([import('../photoScale'), import('../photoChoice')]);
  return choosePhotos(await Promise.all(picked.map(downscalePhoto)), alreadyHeld, limits);
}

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
        <Suspense fallback={null}>
          <Group gap="md" pt={10}>
            {files.map((file, i) => (
              <PhotoThumb key={`${file.name}-${file.lastModified}-${i}`} blob={file} alt={file.name} onRemove={() => onChange(files.filter((_, j) => j !== i))} />
            ))}
          </Group>
        </Suspense>
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
          void preparePhotos(picked, held + files.length, limits)
            .then((choice) => {
              setRefused(choice.refused);
              if (choice.accepted.length > 0) onChange([...files, ...choice.accepted]);
            })
            .catch(() => setRefused(['The photo could not be read on this phone. Try again.']))
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
