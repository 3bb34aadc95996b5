import { useMutation } from '@tanstack/react-query';
import type { LoginInput } from '@hitchbook/shared/schemas/auth';
import { useAuth } from '../../../lib/auth';

export function useSignIn() {
  const { signIn } = useAuth();
  return useMutation({ mutationFn: ({ email, password }: LoginInput) => signIn(email, password) });
}
