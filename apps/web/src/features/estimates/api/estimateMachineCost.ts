import type { CostBreakdownResponse, MachineCostResponse } from '@hitchbook/shared/estimates';
import type { MachineCostRequestInput } from '@hitchbook/shared/schemas/estimates';
import { api } from '../../../lib/api';

export type BreakdownKey = keyof CostBreakdownResponse;
export type MachineCostEstimate = MachineCostResponse;

export function estimateMachineCost(input: MachineCostRequestInput) {
  return api.post<MachineCostResponse>('/api/estimates/machine-cost', input);
}
