import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PartyInput } from '@hitchbook/shared/schemas/users';
import { api } from '../../../lib/api';
import type { Party } from './listParties';

export function createParty(input: PartyInput) {
  return api.post<Party>('/api/parties', input);
}

export function useCreateParty() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createParty,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['parties'] }),
  });
}
