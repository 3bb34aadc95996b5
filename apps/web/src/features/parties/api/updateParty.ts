import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PartyInput } from '@hitchbook/shared/schemas/users';
import { api } from '../../../lib/api';
import type { Party } from './listParties';

export function updateParty(id: string, input: PartyInput) {
  return api.patch<Party>(`/api/parties/${encodeURIComponent(id)}`, input);
}

export function useUpdateParty(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: PartyInput) => updateParty(id, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['parties'] }),
  });
}
