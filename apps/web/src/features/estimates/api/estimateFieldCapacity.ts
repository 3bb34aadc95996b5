import { useMutation } from '@tanstack/react-query';
import type { FieldCapacityRequestInput } from '@hitchbook/shared/schemas/estimates';
import { api } from '../../../lib/api';

export interface FieldCapacity {
  acresPerHour: string;
  hectaresPerHour: string;
}

export function estimateFieldCapacity(input: FieldCapacityRequestInput) {
  return api.post<FieldCapacity>('/api/estimates/field-capacity', input);
}

export function useEstimateFieldCapacity() {
  return useMutation({ mutationFn: estimateFieldCapacity });
}
