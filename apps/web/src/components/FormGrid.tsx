import type { ReactNode } from 'react';
import { Box } from '@mantine/core';

interface FormGridProps {
  children: ReactNode;
  /** Side by side on every screen (two short figures), rather than stacked on a narrow phone. */
  alwaysTwo?: boolean;
  gap?: 'sm' | 'md';
}

/**
 * Two columns of inputs or buttons. A CSS grid does what the cab form needs of Mantine's SimpleGrid,
 * without its responsive style code on the page a phone loads first.
 */
export function FormGrid({ children, alwaysTwo = false, gap = 'md' }: FormGridProps) {
  return (
    <Box
      style={{
        display: 'grid',
        gap: `var(--mantine-spacing-${gap})`,
        // Stacked below two 15rem columns: a phone held upright.
        gridTemplateColumns: alwaysTwo ? 'repeat(2, minmax(0, 1fr))' : 'repeat(auto-fit, minmax(min(100%, 15rem), 1fr))',
      }}
    >
      {children}
    </Box>
  );
}
