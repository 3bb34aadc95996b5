import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { AuditEntryDto } from '@hitchbook/shared/schemas/audit';
import type { Page } from '@hitchbook/shared/schemas/common';
import { api } from '../../../lib/api';
import type { AuditFilters } from '../auditFilters';

export type AuditListParams = AuditFilters & { page: number; pageSize: number };

export function listAudit(params: AuditListParams, signal?: AbortSignal) {
  return api.get<Page<AuditEntryDto>>('/api/audit', { query: { ...params }, signal });
}

export function auditQueryOptions(params: AuditListParams) {
  return queryOptions({
    queryKey: ['audit', 'list', params],
    queryFn: ({ signal }) => listAudit(params, signal),
    placeholderData: keepPreviousData,
  });
}

export function useAudit(params: AuditListParams) {
  return useQuery(auditQueryOptions(params));
}
