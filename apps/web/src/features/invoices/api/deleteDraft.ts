import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { invalidateBilling } from './invalidate';

export function deleteDraft(id: string) {
  return api.delete(`/api/invoices/${encodeURIComponent(id)}`);
}

export function useDeleteDraft(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => deleteDraft(id),
    onSuccess: async () => {
      queryClient.removeQueries({ queryKey: ['invoices', 'detail', id] });
      await invalidateBilling(queryClient);
    },
  });
}
