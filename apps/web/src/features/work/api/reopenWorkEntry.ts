import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { WorkEntryWithWarnings } from '@hitchbook/shared/schemas/work-entries';
import { api } from '../../../lib/api';
import { refreshAfterEntryChange } from './saveWorkEntry';

/** An approved entry is changed only after reopening it; the server keeps the change in the audit log. */
export function reopenWorkEntry(id: string, version: number) {
  return api.post<WorkEntryWithWarnings>(`/api/work-entries/${encodeURIComponent(id)}/reopen`, { version });
}

export function useReopenWorkEntry() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, version }: { id: string; version: number }) => reopenWorkEntry(id, version),
    onSuccess: () => refreshAfterEntryChange(queryClient),
  });
}
