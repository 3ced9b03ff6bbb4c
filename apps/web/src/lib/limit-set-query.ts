import { useQuery } from '@tanstack/react-query';
import type { LimitSet } from '@emberline/contracts/limit-sets';
import { api } from './api-client';

/** A limit revision with its rules, by id: what a finding was judged against (kept, it never changes once published). */
export function useJudgedAgainst(limitSetId: string | null) {
  return useQuery({
    queryKey: ['limit-sets', 'detail', limitSetId],
    queryFn: () => api.get<LimitSet>(`/limit-sets/${encodeURIComponent(limitSetId ?? '')}`),
    enabled: limitSetId !== null,
    staleTime: Infinity,
  });
}
