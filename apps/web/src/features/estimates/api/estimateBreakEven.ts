import { useMutation } from '@tanstack/react-query';
import type { BreakEvenResponse } from '@hitchbook/shared/estimates';
import type { BreakEvenRequestInput } from '@hitchbook/shared/schemas/estimates';
import { api } from '../../../lib/api';

export function estimateBreakEven(input: BreakEvenRequestInput) {
  return api.post<BreakEvenResponse>('/api/estimates/break-even', input);
}

export function useEstimateBreakEven() {
  return useMutation({ mutationFn: estimateBreakEven });
}
