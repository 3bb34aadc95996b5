import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { WorkEntryWithWarnings } from '@hitchbook/shared/schemas/work-entries';
import { api } from '../../../lib/api';
import { refreshAfterEntryChange } from './saveWorkEntry';

/** An owner or partner accepts a submitted entry; only approved entries are billed and squared up. */
export function approveWorkEntry(id: string, version: number) {
  return api.post<WorkEntryWithWarnings>(`/api/work-entries/${encodeURIComponent(id)}/approve`, { version });
}

export function useApproveWorkEntry() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, version }: { id: string; version: number }) => approveWorkEntry(id, version),
    onSuccess: () => refreshAfterEntryChange(queryClient),
  });
}

export interface BatchOutcome {
  done: number;
  failed: { entryId: string; message: string }[];
}

/** One request per entry, one after another, so a refusal names the entry it belongs to. */
export async function approveWorkEntries(entries: readonly { id: string; version: number }[]): Promise<BatchOutcome> {
  const outcome: BatchOutcome = { done: 0, failed: [] };
  for (const entry of entries) {
    try {
      await approveWorkEntry(entry.id, entry.version);
      outcome.done += 1;
    } catch (error) {
      outcome.failed.push({ entryId: entry.id, message: error instanceof Error ? error.message : 'Not approved.' });
    }
  }
  return outcome;
}

export function useApproveWorkEntries() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: approveWorkEntries, onSettled: () => refreshAfterEntryChange(queryClient) });
}
