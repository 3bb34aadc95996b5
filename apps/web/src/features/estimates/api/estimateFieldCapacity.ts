import type { FieldCapacityResponse } from '@hitchbook/shared/estimates';
import type { FieldCapacityRequestInput } from '@hitchbook/shared/schemas/estimates';
import { api } from '../../../lib/api';

export type FieldCapacity = FieldCapacityResponse;

export function estimateFieldCapacity(input: FieldCapacityRequestInput) {
  return api.post<FieldCapacityResponse>('/api/estimates/field-capacity', input);
}
