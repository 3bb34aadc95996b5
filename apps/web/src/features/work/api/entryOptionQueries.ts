import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Role } from '@hitchbook/shared/roles';
import { OFFLINE_FIRST } from '../../offline/networkMode';
import { EVERY_PARTY, listBillToParties } from './listBillToParties';
import { FIELDS_IN_USE, listFieldOptions } from './listFieldOptions';
import { ACTIVE_MACHINES, listMachineOptions } from './listMachineOptions';
import { activeOperators, listMembers, MEMBER_READERS } from './listMembers';
import { listWorkTypes } from './listWorkTypes';

// The entries list's filters, cached: the same reads the entry forms make (loadEntryOptions). The reads stay in
// their own files, free of the query library, so the cab page (app/cab) can make them without loading it.

export function useMachineOptions() {
  return useQuery(
    queryOptions({ networkMode: OFFLINE_FIRST, queryKey: ['machines', 'list', ACTIVE_MACHINES, 'options'], queryFn: ({ signal }) => listMachineOptions(signal), staleTime: 60_000 }),
  );
}

export function useFieldOptions() {
  return useQuery(
    queryOptions({ networkMode: OFFLINE_FIRST, queryKey: ['fields', 'list', FIELDS_IN_USE, 'options'], queryFn: ({ signal }) => listFieldOptions(signal), staleTime: 60_000 }),
  );
}

export function useWorkTypes() {
  return useQuery(
    queryOptions({ networkMode: OFFLINE_FIRST, queryKey: ['work-types', 'list'], queryFn: ({ signal }) => listWorkTypes(signal), staleTime: 5 * 60_000 }),
  );
}

export function useBillToParties() {
  return useQuery(
    queryOptions({ networkMode: OFFLINE_FIRST, queryKey: ['parties', 'list', EVERY_PARTY, 'options'], queryFn: ({ signal }) => listBillToParties(signal), staleTime: 60_000 }),
  );
}

export function useOperators(role: Role) {
  return useQuery({
    networkMode: OFFLINE_FIRST,
    queryKey: ['users', 'list', { pageSize: 200 }, 'options'],
    queryFn: ({ signal }) => listMembers(signal),
    staleTime: 60_000,
    enabled: MEMBER_READERS.includes(role),
    select: activeOperators,
  });
}
