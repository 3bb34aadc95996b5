import { Button, Group } from '@mantine/core';
import { notifications } from '@mantine/notifications';
import { IconDownload } from '@tabler/icons-react';
import { useState } from 'react';

export interface DownloadChoice {
  label: string;
  download: () => Promise<void>;
}

/** Export buttons: each file is fetched with the session's token and handed to the browser. */
export function DownloadButtons({ files }: { files: DownloadChoice[] }) {
  const [busy, setBusy] = useState<string | null>(null);
  const run = async (file: DownloadChoice) => {
    setBusy(file.label);
    try {
      await file.download();
    } catch (error) {
      notifications.show({ color: 'red', title: 'The download did not start', message: error instanceof Error ? error.message : '' });
    } finally {
      setBusy(null);
    }
  };
  return (
    <Group gap="sm">
      {files.map((file) => (
        <Button key={file.label} variant="default" leftSection={<IconDownload size={18} />} loading={busy === file.label} onClick={() => void run(file)}>
          {file.label}
        </Button>
      ))}
    </Group>
  );
}
