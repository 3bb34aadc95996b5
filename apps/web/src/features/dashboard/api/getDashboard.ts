import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';

export interface DashboardCard {
  key: string;
  label: string;
  value: string;
  hint?: string;
}

export interface Dashboard {
  cards: DashboardCard[];
}

export function getDashboard(signal?: AbortSignal) {
  return api.get<Dashboard>('/api/dashboard', { signal });
}

// The cards depend on who is signed in; the cache is cleared on every sign-in and sign-out.
export function dashboardQueryOptions() {
  return queryOptions({ queryKey: ['dashboard'], queryFn: ({ signal }) => getDashboard(signal) });
}

export function useDashboard() {
  return useQuery(dashboardQueryOptions());
}
