import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RateSheetCreateInput, RateSheetDto } from '@hitchbook/shared/schemas/rate-sheets';
import { api } from '../../../lib/api';

export function createRateSheet(input: RateSheetCreateInput) {
  return api.post<RateSheetDto>('/api/rate-sheets', input);
}

export function useCreateRateSheet() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createRateSheet,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['rate-sheets'] }),
  });
}
