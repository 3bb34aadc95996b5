import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Page } from '@hitchbook/shared/schemas/common';
import type { RateRelationship } from '@hitchbook/shared/schemas/rate-sheets';
import type { WorkUnit } from '@hitchbook/shared/work-types';
import { api } from '../../../lib/api';

export interface WorkTypeOption {
  id: string;
  name: string;
  defaultUnit: WorkUnit;
  archived: boolean;
}

export interface MachineOption {
  id: string;
  name: string;
}

export interface PartyOption {
  id: string;
  name: string;
  kind: 'household' | 'customer';
  relationship: RateRelationship;
}

// The pickers of the sheet form. Each is filed under its own resource, so adding a work type,
// machine or party elsewhere refreshes them too.

export function workTypeOptionsQueryOptions() {
  return queryOptions({
    queryKey: ['work-types', 'options'],
    // Archived ones too, so a sheet that still prices one shows it by name.
    queryFn: ({ signal }) => api.get<Page<WorkTypeOption>>('/api/work-types', { query: { pageSize: 200, archived: 'all' }, signal }),
    select: (page) => page.items,
  });
}

export function machineOptionsQueryOptions() {
  return queryOptions({
    queryKey: ['machines', 'options'],
    queryFn: ({ signal }) => api.get<Page<MachineOption>>('/api/machines', { query: { pageSize: 200, sort: 'name' }, signal }),
    select: (page) => page.items,
  });
}

export function partyOptionsQueryOptions() {
  return queryOptions({
    queryKey: ['parties', 'options', 'all'],
    queryFn: ({ signal }) => api.get<Page<PartyOption>>('/api/parties', { query: { pageSize: 200, sort: 'name' }, signal }),
    select: (page) => page.items,
  });
}

export const useWorkTypeOptions = () => useQuery(workTypeOptionsQueryOptions());
export const useMachineOptions = () => useQuery(machineOptionsQueryOptions());
export const usePartyOptions = () => useQuery(partyOptionsQueryOptions());
