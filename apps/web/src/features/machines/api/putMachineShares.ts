import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { MachineSharesDto, MachineSharesPutInput } from '@hitchbook/shared/schemas/machines';
import { api } from '../../../lib/api';

export function putMachineShares(id: string, input: MachineSharesPutInput) {
  return api.request<MachineSharesDto>('PUT', `/api/machines/${encodeURIComponent(id)}/shares`, { body: input });
}

export function usePutMachineShares(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: MachineSharesPutInput) => putMachineShares(id, input),
    // The list shows today's owners too, so every machine query is refreshed.
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['machines'] }),
  });
}
