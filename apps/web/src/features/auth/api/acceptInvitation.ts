import { useMutation } from '@tanstack/react-query';
import { useAuth } from '../../../lib/auth';

export function useAcceptInvitation() {
  const { acceptInvitation } = useAuth();
  return useMutation({ mutationFn: acceptInvitation });
}
