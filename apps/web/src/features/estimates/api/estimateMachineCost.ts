import { useMutation } from '@tanstack/react-query';
import type { COST_BREAKDOWN_KEYS } from '@hitchbook/shared/machine-cost';
import type { MachineCostRequestInput } from '@hitchbook/shared/schemas/estimates';
import { api } from '../../../lib/api';

export type BreakdownKey = (typeof COST_BREAKDOWN_KEYS)[number];
/** The server's cost breakdown, every figure a decimal string. */
export type Breakdown = Record<BreakdownKey, string>;

export interface MachineCostEstimate {
  remainingValuePct: string;
  salvageValue: string;
  capitalRecoveryFactor: string;
  fuelGallonsPerHour: string;
  perYear: Breakdown;
  perHour: Breakdown;
}

export function estimateMachineCost(input: MachineCostRequestInput) {
  return api.post<MachineCostEstimate>('/api/estimates/machine-cost', input);
}

export function useEstimateMachineCost() {
  return useMutation({ mutationFn: estimateMachineCost });
}
