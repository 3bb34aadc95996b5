import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { MachineDto, MachineUpdateInput } from '@hitchbook/shared/schemas/machines';
import { api } from '../../../lib/api';

export function updateMachine(id: string, input: MachineUpdateInput) {
  return api.patch<MachineDto>(`/api/machines/${encodeURIComponent(id)}`, input);
}

export function useUpdateMachine(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: MachineUpdateInput) => updateMachine(id, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['machines'] }),
  });
}
