import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Role } from '@hitchbook/shared/roles';
import { api } from '../../../lib/api';

export interface InvitationInput {
  email: string;
  name: string;
  role: Role;
  partyId: string | null;
}

export function inviteUser(input: InvitationInput) {
  return api.post<unknown>('/api/users/invitations', input);
}

export function useInviteUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: inviteUser,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['users'] }),
  });
}
