import type { z } from 'zod';
import type { workEntryUpdateSchema, WorkEntryWithWarnings } from '@hitchbook/shared/schemas/work-entries';
import { api } from '../../../lib/api';

export type WorkEntryChange = z.input<typeof workEntryUpdateSchema>;

/** The version the change was made against travels along; a stale one is refused, not overwritten. */
export function updateWorkEntry(id: string, change: WorkEntryChange) {
  return api.patch<WorkEntryWithWarnings>(`/api/work-entries/${encodeURIComponent(id)}`, change);
}
