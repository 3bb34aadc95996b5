import { useMutation } from '@tanstack/react-query';
import type { JointOwnershipRequestInput } from '@hitchbook/shared/schemas/estimates';
import { api } from '../../../lib/api';

export interface JointOwnershipPlan {
  totalCost: string;
  members: { id: string; share: string; paid: string; balance: string }[];
  transfers: { from: string; to: string; amount: string }[];
}

export function planJointOwnership(input: JointOwnershipRequestInput) {
  return api.post<JointOwnershipPlan>('/api/estimates/joint-ownership', input);
}

export function usePlanJointOwnership() {
  return useMutation({ mutationFn: planJointOwnership });
}
