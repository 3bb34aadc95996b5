import type { ReactNode } from 'react';
import { UnstyledButton } from '@mantine/core';

/** A figure that opens the entries behind it; underlined so it reads as a link in a table. */
export function FigureButton({ label, onOpen, strong, children }: { label: string; onOpen: () => void; strong?: boolean; children: ReactNode }) {
  return (
    <UnstyledButton
      onClick={onOpen}
      aria-label={label}
      fw={strong ? 700 : undefined}
      style={{ color: 'inherit', textDecoration: 'underline', textDecorationStyle: 'dotted', textUnderlineOffset: 3, whiteSpace: 'nowrap' }}
    >
      {children}
    </UnstyledButton>
  );
}
