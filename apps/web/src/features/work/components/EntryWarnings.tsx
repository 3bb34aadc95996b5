import { Alert, List } from '@mantine/core';
import { IconAlertCircle } from '@tabler/icons-react';
import type { WorkEntryWarning } from '@hitchbook/shared/work-entry-checks';

/** The server's plausibility findings: the entry is saved, these are only worth a second look. */
export function EntryWarnings({ warnings }: { warnings: readonly WorkEntryWarning[] }) {
  if (warnings.length === 0) return null;
  return (
    <Alert color="clay" variant="outline" icon={<IconAlertCircle />} title="Saved, but worth a second look" data-testid="entry-warnings">
      <List spacing={4} styles={{ root: { listStylePosition: 'outside', paddingInlineStart: 20 } }}>
        {warnings.map((w) => (
          <List.Item key={`${w.code}-${w.message}`}>{w.message}</List.Item>
        ))}
      </List>
    </Alert>
  );
}
