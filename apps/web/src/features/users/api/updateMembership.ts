import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Role } from '@hitchbook/shared/roles';
import { api } from '../../../lib/api';

export interface MembershipChange {
  role: Role;
  partyId: string | null;
}

export function updateMembership(membershipId: string, change: MembershipChange) {
  return api.patch<unknown>(`/api/users/${encodeURIComponent(membershipId)}`, change);
}

export function useUpdateMembership(membershipId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (change: MembershipChange) => updateMembership(membershipId, change),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['users'] }),
  });
}
