import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api';

export function removeMembership(membershipId: string) {
  return api.delete(`/api/users/${encodeURIComponent(membershipId)}`);
}

export function useRemoveMembership() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: removeMembership,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['users'] }),
  });
}
