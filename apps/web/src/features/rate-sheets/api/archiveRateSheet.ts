import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RateSheetDto } from '@hitchbook/shared/schemas/rate-sheets';
import { api } from '../../../lib/api';

/** Archived sheets price nothing from then on but stay readable, so old invoices can be explained. */
export function archiveRateSheet(id: string) {
  return api.delete<RateSheetDto>(`/api/rate-sheets/${encodeURIComponent(id)}`);
}

export function useArchiveRateSheet(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => archiveRateSheet(id),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['rate-sheets'] }),
  });
}
