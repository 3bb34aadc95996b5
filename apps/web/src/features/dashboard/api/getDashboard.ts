import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DashboardDto } from '@hitchbook/shared/schemas/reports';
import { api } from '../../../lib/api';

export type { DashboardCardDto as DashboardCard, DashboardChartDto as DashboardChart } from '@hitchbook/shared/schemas/reports';

export function getDashboard(signal?: AbortSignal) {
  return api.get<DashboardDto>('/api/dashboard', { signal });
}

// The cards depend on who is signed in; the cache is cleared on every sign-in and sign-out.
export function dashboardQueryOptions() {
  return queryOptions({ queryKey: ['dashboard'], queryFn: ({ signal }) => getDashboard(signal) });
}

export function useDashboard() {
  return useQuery(dashboardQueryOptions());
}
