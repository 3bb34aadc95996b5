import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { FieldDto, FieldUpdateInput } from '@hitchbook/shared/schemas/fields';
import { api } from '../../../lib/api';

export function updateField(id: string, input: FieldUpdateInput) {
  return api.patch<FieldDto>(`/api/fields/${encodeURIComponent(id)}`, input);
}

export function useUpdateField(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: FieldUpdateInput) => updateField(id, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['fields'] }),
  });
}

/** Archiving keeps the field on the entries that used it; it only leaves the pickers. */
export function useSetFieldArchived() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, archived }: { id: string; archived: boolean }) => updateField(id, { archived }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['fields'] }),
  });
}
