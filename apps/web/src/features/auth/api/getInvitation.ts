import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Role } from '@hitchbook/shared/roles';
import { api } from '../../../lib/api';

export interface Invitation {
  email: string;
  role: Role;
  operationName: string;
}

export function getInvitation(token: string, signal?: AbortSignal) {
  return api.get<Invitation>(`/api/auth/invitations/${encodeURIComponent(token)}`, { anonymous: true, signal });
}

export function invitationQueryOptions(token: string) {
  return queryOptions({
    queryKey: ['invitations', 'detail', token],
    queryFn: ({ signal }) => getInvitation(token, signal),
    enabled: token.length > 0,
    retry: false,
  });
}

export function useInvitation(token: string) {
  return useQuery(invitationQueryOptions(token));
}
