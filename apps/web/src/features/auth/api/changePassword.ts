import { useMutation } from '@tanstack/react-query';
import { api } from '../../../lib/api';

export function changePassword(input: { currentPassword: string; newPassword: string }) {
  return api.post<void>('/api/auth/password', input);
}

export function useChangePassword() {
  return useMutation({ mutationFn: changePassword });
}
