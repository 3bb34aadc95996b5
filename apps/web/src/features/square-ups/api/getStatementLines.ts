import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { StatementLineKind, StatementLinesDto } from '@hitchbook/shared/schemas/square-ups';
import { api } from '../../../lib/api';

export interface LinesFilter {
  kind: StatementLineKind;
  household?: string;
  machine?: string;
  page: number;
}

export const LINES_PAGE_SIZE = 50;

export function getStatementLines(id: string, filter: LinesFilter, signal?: AbortSignal) {
  return api.get<StatementLinesDto>(`/api/square-ups/${encodeURIComponent(id)}/statement/lines`, {
    query: { ...filter, pageSize: LINES_PAGE_SIZE },
    signal,
  });
}

export function statementLinesQueryOptions(id: string, filter: LinesFilter) {
  return queryOptions({
    queryKey: ['square-ups', 'detail', id, 'lines', filter],
    queryFn: ({ signal }) => getStatementLines(id, filter, signal),
    // Paging keeps the last page on screen instead of flashing a loader.
    placeholderData: keepPreviousData,
  });
}

export function useStatementLines(id: string, filter: LinesFilter, enabled: boolean) {
  return useQuery({ ...statementLinesQueryOptions(id, filter), enabled });
}
