import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { CustomIncomeReportDto } from '@hitchbook/shared/schemas/reports';
import { api } from '../../../lib/api';

export function getCustomIncome(year: number, signal?: AbortSignal) {
  return api.get<CustomIncomeReportDto>('/api/reports/custom-income', { query: { year }, signal });
}

export function customIncomeQueryOptions(year: number) {
  return queryOptions({
    queryKey: ['reports', 'custom-income', year],
    queryFn: ({ signal }) => getCustomIncome(year, signal),
    placeholderData: keepPreviousData,
  });
}

export function useCustomIncome(year: number) {
  return useQuery(customIncomeQueryOptions(year));
}
