import { useMutation } from '@tanstack/react-query';
import { api } from '../../../lib/api';

export function confirmPasswordReset(input: { token: string; password: string }) {
  return api.post<void>('/api/auth/password-reset/confirm', input, { anonymous: true });
}

export function useConfirmPasswordReset() {
  return useMutation({ mutationFn: confirmPasswordReset });
}
