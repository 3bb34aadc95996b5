import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { workEntryUpdateSchema, WorkEntryWithWarnings } from '@hitchbook/shared/schemas/work-entries';
import { api } from '../../../lib/api';
import { refreshAfterEntryChange } from './saveWorkEntry';

export type WorkEntryChange = z.input<typeof workEntryUpdateSchema>;

/** The version the change was made against travels along; a stale one is refused, not overwritten. */
export function updateWorkEntry(id: string, change: WorkEntryChange) {
  return api.patch<WorkEntryWithWarnings>(`/api/work-entries/${encodeURIComponent(id)}`, change);
}

export function useUpdateWorkEntry(id: string) {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: (change: WorkEntryChange) => updateWorkEntry(id, change), onSuccess: () => refreshAfterEntryChange(queryClient) });
}
