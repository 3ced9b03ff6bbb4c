import { infiniteQueryOptions, useInfiniteQuery } from '@tanstack/react-query';
import type { AuditListResponse } from '@emberline/contracts/audit';
import { api } from '../../../lib/api-client';

export const auditKeys = {
  all: ['audit-log'] as const,
  list: () => [...auditKeys.all, 'list'] as const,
};

export const auditLogQueryOptions = () =>
  infiniteQueryOptions({
    queryKey: auditKeys.list(),
    queryFn: ({ pageParam }) =>
      api.get<AuditListResponse>(`/audit-log?limit=50${pageParam ? `&before=${pageParam}` : ''}`),
    initialPageParam: 0,
    getNextPageParam: (last) => last.nextBefore ?? undefined,
  });

export function useAuditLog() {
  return useInfiniteQuery(auditLogQueryOptions());
}
