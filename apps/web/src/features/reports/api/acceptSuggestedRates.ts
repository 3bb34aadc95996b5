import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AcceptedRatesDto } from '@hitchbook/shared/schemas/reports';
import { api } from '../../../lib/api';

export interface AcceptRequest {
  year: number;
  machineIds: string[];
}

export function acceptSuggestedRates(input: AcceptRequest) {
  return api.post<AcceptedRatesDto>('/api/reports/machine-rates/accept', input);
}

export function useAcceptSuggestedRates() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: acceptSuggestedRates,
    // The new sheet changes the report's current rates and the rate-sheet lists.
    onSuccess: () =>
      Promise.all([queryClient.invalidateQueries({ queryKey: ['reports'] }), queryClient.invalidateQueries({ queryKey: ['rate-sheets'] })]),
  });
}
