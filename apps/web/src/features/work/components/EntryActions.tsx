import { Button } from '@mantine/core';
import { IconDeviceFloppy, IconSend } from '@tabler/icons-react';
import { FormGrid } from '../../../components/FormGrid';

export type EntryIntent = 'draft' | 'submitted';

interface EntryActionsProps {
  submitting: boolean;
  /** Which of the two buttons sent the form, to show its spinner. */
  intent: EntryIntent;
  onIntent: (intent: EntryIntent) => void;
  draftLabel: string;
  submitLabel: string | null;
}

/** Two full-width buttons, the one that sends the entry on for approval the larger target. */
export function EntryActions({ submitting, intent, onIntent, draftLabel, submitLabel }: EntryActionsProps) {
  return (
    <FormGrid gap="sm">
      {submitLabel && (
        <Button
          type="submit"
          size="xl"
          leftSection={<IconSend />}
          loading={submitting && intent === 'submitted'}
          disabled={submitting && intent !== 'submitted'}
          onClick={() => onIntent('submitted')}
        >
          {submitLabel}
        </Button>
      )}
      <Button
        type="submit"
        size="xl"
        variant="default"
        leftSection={<IconDeviceFloppy />}
        loading={submitting && intent === 'draft'}
        disabled={submitting && intent !== 'draft'}
        onClick={() => onIntent('draft')}
      >
        {draftLabel}
      </Button>
    </FormGrid>
  );
}
