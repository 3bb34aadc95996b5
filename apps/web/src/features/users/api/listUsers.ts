import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { Role } from '@hitchbook/shared/roles';
import type { Page } from '@hitchbook/shared/schemas/common';
import { api } from '../../../lib/api';
import type { ListParams } from '../../../lib/listParams';

export interface Member {
  membershipId: string;
  userId: string;
  email: string;
  name: string;
  role: Role;
  partyId: string | null;
  partyName: string | null;
  status: 'active' | 'invited';
}

export function listUsers(params: ListParams, signal?: AbortSignal) {
  return api.get<Page<Member>>('/api/users', { query: { page: params.page, pageSize: params.pageSize }, signal });
}

export function usersQueryOptions(params: ListParams) {
  return queryOptions({
    queryKey: ['users', 'list', { page: params.page, pageSize: params.pageSize }],
    queryFn: ({ signal }) => listUsers(params, signal),
    placeholderData: keepPreviousData,
  });
}

export function useUsers(params: ListParams) {
  return useQuery(usersQueryOptions(params));
}
