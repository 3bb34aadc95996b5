import type { ReactNode } from 'react';
import { Modal } from '@mantine/core';
import { useMediaQuery } from '@mantine/hooks';

interface ActionModalProps {
  opened: boolean;
  title: string;
  onClose: () => void;
  children: ReactNode;
}

/** Every invoice action's dialog: full screen on a phone, where a small dialog leaves no room to type. */
export function ActionModal({ opened, title, onClose, children }: ActionModalProps) {
  const phone = useMediaQuery('(max-width: 48em)');
  return (
    <Modal opened={opened} onClose={onClose} title={title} fullScreen={phone} size="lg">
      {opened && children}
    </Modal>
  );
}
