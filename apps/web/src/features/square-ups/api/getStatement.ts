import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SquareUpStatementDto } from '@hitchbook/shared/schemas/square-ups';
import { api } from '../../../lib/api';

export function getStatement(id: string, signal?: AbortSignal) {
  return api.get<SquareUpStatementDto>(`/api/square-ups/${encodeURIComponent(id)}/statement`, { signal });
}

export function statementQueryOptions(id: string) {
  return queryOptions({ queryKey: ['square-ups', 'detail', id, 'statement'], queryFn: ({ signal }) => getStatement(id, signal) });
}

export function useStatement(id: string) {
  return useQuery(statementQueryOptions(id));
}
