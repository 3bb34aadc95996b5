import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CostEntryCreateInput, CostEntryDto } from '@hitchbook/shared/schemas/machines';
import { api } from '../../../lib/api';

export function createCostEntry(machineId: string, input: CostEntryCreateInput) {
  return api.post<CostEntryDto>(`/api/machines/${encodeURIComponent(machineId)}/costs`, input);
}

export function useCreateCostEntry(machineId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CostEntryCreateInput) => createCostEntry(machineId, input),
    // Costs feed the machine's actual rate, so the summary is refreshed with the table.
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['machines', 'detail', machineId] }),
  });
}
