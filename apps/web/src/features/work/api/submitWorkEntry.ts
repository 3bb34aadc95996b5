import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { WorkEntryWithWarnings } from '@hitchbook/shared/schemas/work-entries';
import { api } from '../../../lib/api';
import { refreshAfterEntryChange } from './saveWorkEntry';

/** An operator sends a draft in for approval. */
export function submitWorkEntry(id: string, version: number) {
  return api.post<WorkEntryWithWarnings>(`/api/work-entries/${encodeURIComponent(id)}/submit`, { version });
}

export function useSubmitWorkEntry() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, version }: { id: string; version: number }) => submitWorkEntry(id, version),
    onSuccess: () => refreshAfterEntryChange(queryClient),
  });
}
