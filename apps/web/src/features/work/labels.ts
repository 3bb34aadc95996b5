import type { WorkEntryState } from '@hitchbook/shared/schemas/work-entries';

export const STATE_LABELS: Record<WorkEntryState, string> = {
  draft: 'Draft',
  submitted: 'Submitted',
  approved: 'Approved',
  invoiced: 'On invoice',
  squared: 'Squared up',
};

export const STATE_COLORS: Record<WorkEntryState, string> = {
  draft: 'slate',
  submitted: 'clay',
  approved: 'harbor',
  invoiced: 'harbor',
  squared: 'harbor',
};
