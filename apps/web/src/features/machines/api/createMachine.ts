import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { MachineCreateInput, MachineDto } from '@hitchbook/shared/schemas/machines';
import { api } from '../../../lib/api';

export function createMachine(input: MachineCreateInput) {
  return api.post<MachineDto>('/api/machines', input);
}

export function useCreateMachine() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createMachine,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['machines'] }),
  });
}
