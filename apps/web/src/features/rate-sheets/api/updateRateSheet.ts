import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RateSheetCreateInput, RateSheetDto } from '@hitchbook/shared/schemas/rate-sheets';
import { api } from '../../../lib/api';

/** The form sends the whole sheet, so the lines and machine rates on screen replace the stored ones. */
export function updateRateSheet(id: string, input: RateSheetCreateInput) {
  return api.patch<RateSheetDto>(`/api/rate-sheets/${encodeURIComponent(id)}`, input);
}

export function useUpdateRateSheet(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: RateSheetCreateInput) => updateRateSheet(id, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['rate-sheets'] }),
  });
}
