import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { VerificationJob } from '@emberline/contracts/records';
import { api } from '../../../lib/api-client';

export const recordsKeys = { latest: ['records', 'verifications', 'latest'] as const };

/** The latest records check of the server (null before any), read again every second while it runs. */
export function useLatestVerification() {
  return useQuery({
    queryKey: recordsKeys.latest,
    queryFn: () =>
      api
        .get<{ job: VerificationJob | null }>('/records/verifications/latest')
        .then((body) => body.job),
    staleTime: 0,
    refetchInterval: (query) => (query.state.data?.state === 'running' ? 1000 : false),
  });
}

/** Starts a records check in the background (or joins the one running). */
export function useStartVerification() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.post<VerificationJob>('/records/verifications'),
    onSuccess: (job) => queryClient.setQueryData(recordsKeys.latest, job),
  });
}
