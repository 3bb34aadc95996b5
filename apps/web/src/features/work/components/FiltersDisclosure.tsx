import type { ReactNode } from 'react';
import { Button, Collapse, Group, Stack } from '@mantine/core';
import { useDisclosure } from '@mantine/hooks';
import { IconAdjustmentsHorizontal } from '@tabler/icons-react';

/** On a phone the filters fold away behind one button, so the entries come first. */
export function FiltersDisclosure({ phone, active, children }: { phone: boolean; active: boolean; children: ReactNode }) {
  const [opened, { toggle }] = useDisclosure(false);
  if (!phone) return <>{children}</>;
  return (
    <Stack gap="sm" w="100%">
      <Button variant={active ? 'light' : 'default'} leftSection={<IconAdjustmentsHorizontal size={20} />} onClick={toggle} aria-expanded={opened}>
        {opened ? 'Hide filters' : active ? 'Filters (on)' : 'Filters'}
      </Button>
      <Collapse in={opened}>
        <Group gap="sm">{children}</Group>
      </Collapse>
    </Stack>
  );
}
