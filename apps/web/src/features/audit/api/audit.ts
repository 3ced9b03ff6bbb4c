import { infiniteQueryOptions, useInfiniteQuery, useQuery } from '@tanstack/react-query';
import type { AuditListQuery, AuditListResponse, HistoryEntry } from '@emberline/contracts/audit';
import type { Page } from '@emberline/contracts/paging';
import { api } from '../../../lib/api-client';

export type AuditFilters = Partial<Omit<AuditListQuery, 'before' | 'limit'>>;

export const auditKeys = {
  all: ['audit-log'] as const,
  list: (filters: AuditFilters) => [...auditKeys.all, 'list', filters] as const,
  history: (kind: HistoryKind, id: string) => [...auditKeys.all, 'history', kind, id] as const,
};

export const auditLogQueryOptions = (filters: AuditFilters) =>
  infiniteQueryOptions({
    queryKey: auditKeys.list(filters),
    queryFn: ({ pageParam }) => {
      const params = new URLSearchParams({ limit: '50' });
      for (const [key, value] of Object.entries(filters)) if (value) params.set(key, value);
      if (pageParam) params.set('before', String(pageParam));
      return api.get<AuditListResponse>(`/audit-log?${params.toString()}`);
    },
    initialPageParam: 0,
    getNextPageParam: (last) => last.nextBefore ?? undefined,
  });

export function useAuditLog(filters: AuditFilters) {
  return useInfiniteQuery(auditLogQueryOptions(filters));
}

export type HistoryKind = 'inspections' | 'findings' | 'limit-sets';

export const HISTORY_PAGE_SIZE = 100;

/** A page of a record's history in words, oldest first. */
export function useRecordHistory(kind: HistoryKind, id: string, page = 1, enabled = true) {
  return useQuery({
    queryKey: [...auditKeys.history(kind, id), page],
    queryFn: () =>
      api.get<Page<HistoryEntry>>(
        `/${kind}/${encodeURIComponent(id)}/history?page=${page}&pageSize=${HISTORY_PAGE_SIZE}`,
      ),
    enabled,
  });
}
