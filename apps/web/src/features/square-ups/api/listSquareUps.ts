import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Page } from '@hitchbook/shared/schemas/common';
import type { SquareUpSummaryDto } from '@hitchbook/shared/schemas/square-ups';
import { api } from '../../../lib/api';

/** A family keeps a handful of periods a year; one page of 100 holds years of them. */
const PAGE_SIZE = 100;

export function listSquareUps(signal?: AbortSignal) {
  return api.get<Page<SquareUpSummaryDto>>('/api/square-ups', { query: { pageSize: PAGE_SIZE }, signal });
}

export function squareUpsQueryOptions() {
  return queryOptions({ queryKey: ['square-ups', 'list'], queryFn: ({ signal }) => listSquareUps(signal) });
}

export function useSquareUps() {
  return useQuery(squareUpsQueryOptions());
}
