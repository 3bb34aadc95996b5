import { useEffect, useState } from 'react';
import { ActionIcon, Box, Image, Skeleton } from '@mantine/core';
import { IconX } from '@tabler/icons-react';

export const THUMB_PX = 96;

interface PhotoThumbProps {
  /** A local file or a fetched one; shown through an object URL that is let go on unmount. */
  blob: Blob | undefined;
  alt: string;
  onRemove?: () => void;
  removing?: boolean;
  onOpen?: () => void;
}

export function PhotoThumb({ blob, alt, onRemove, removing, onOpen }: PhotoThumbProps) {
  const [url, setUrl] = useState<string | null>(null);
  useEffect(() => {
    if (!blob) return;
    const made = URL.createObjectURL(blob);
    setUrl(made);
    return () => URL.revokeObjectURL(made);
  }, [blob]);

  return (
    <Box pos="relative" w={THUMB_PX} h={THUMB_PX} data-testid="photo-thumb">
      {url ? (
        <Image
          src={url}
          alt={alt}
          w={THUMB_PX}
          h={THUMB_PX}
          radius="md"
          fit="cover"
          onClick={onOpen}
          style={onOpen ? { cursor: 'zoom-in' } : undefined}
        />
      ) : (
        <Skeleton w={THUMB_PX} h={THUMB_PX} radius="md" />
      )}
      {onRemove && (
        <ActionIcon
          pos="absolute"
          top={-10}
          right={-10}
          size={40}
          radius="xl"
          color="red"
          variant="filled"
          loading={removing}
          onClick={onRemove}
          aria-label={`Remove ${alt}`}
        >
          <IconX size={22} />
        </ActionIcon>
      )}
    </Box>
  );
}
