import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SquareUpStatementDto } from '@hitchbook/shared/schemas/square-ups';
import { api } from '../../../lib/api';

export function closeSquareUp(id: string) {
  return api.post<SquareUpStatementDto>(`/api/square-ups/${encodeURIComponent(id)}/close`);
}

export function useCloseSquareUp(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => closeSquareUp(id),
    onSuccess: async () => {
      // Closing squares the period's family work, so the work lists and the dashboard change too.
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: ['square-ups'] }),
        queryClient.invalidateQueries({ queryKey: ['dashboard'] }),
        queryClient.invalidateQueries({ queryKey: ['work-entries'] }),
      ]);
    },
  });
}
