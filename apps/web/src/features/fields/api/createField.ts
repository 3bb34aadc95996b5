import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { FieldCreateInput, FieldDto } from '@hitchbook/shared/schemas/fields';
import { api } from '../../../lib/api';

export function createField(input: FieldCreateInput) {
  return api.post<FieldDto>('/api/fields', input);
}

export function useCreateField() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createField,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['fields'] }),
  });
}
