import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SquareUpCreateInput, SquareUpDto } from '@hitchbook/shared/schemas/square-ups';
import { api } from '../../../lib/api';

export function createSquareUp(input: SquareUpCreateInput) {
  return api.post<SquareUpDto>('/api/square-ups', input);
}

export function useCreateSquareUp() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createSquareUp,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['square-ups'] }),
  });
}
