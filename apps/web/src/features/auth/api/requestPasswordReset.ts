import { useMutation } from '@tanstack/react-query';
import { api } from '../../../lib/api';

export function requestPasswordReset(input: { email: string }) {
  return api.post<{ message: string }>('/api/auth/password-reset/request', input, { anonymous: true });
}

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: requestPasswordReset });
}
