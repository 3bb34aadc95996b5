import { useMutation } from '@tanstack/react-query';
import type { JointOwnershipResponse } from '@hitchbook/shared/estimates';
import type { JointOwnershipRequestInput } from '@hitchbook/shared/schemas/estimates';
import { api } from '../../../lib/api';

export type JointOwnershipPlan = JointOwnershipResponse;

export function planJointOwnership(input: JointOwnershipRequestInput) {
  return api.post<JointOwnershipResponse>('/api/estimates/joint-ownership', input);
}

export function usePlanJointOwnership() {
  return useMutation({ mutationFn: planJointOwnership });
}
